import type { ShopRole } from '../utils/permissions'

declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
  }
  interface UserSession {
    shopId: string
    shopName: string
    role: ShopRole
    loggedInAt: string
  }
}

export {}

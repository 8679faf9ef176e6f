import type { ShopRole } from '../utils/permissions'

declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
  }
  // The cookie holds only the server-side session's token; these fields are
  // read from the database when the client fetches its session
  // (server/api/_auth/session.get.ts).
  interface UserSession {
    shopId?: string
    shopName?: string
    role?: ShopRole
  }
}

export {}

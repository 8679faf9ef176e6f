import type { ShopRole } from '../utils/permissions'

declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
  }
  // The sealed cookie holds only `sid`, the server-side session's token. The
  // other fields are filled from the database when the client fetches its
  // session (server/plugins/session-fetch.ts); they are never stored in the cookie.
  interface UserSession {
    sid?: string
    shopId?: string
    shopName?: string
    role?: ShopRole
  }
}

export {}

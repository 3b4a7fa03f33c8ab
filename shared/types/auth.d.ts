// The shape of the signed session cookie (nuxt-auth-utils). Only identity lives here;
// memberships are read from the database on each request so a revoked role takes effect at once.
declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
    isAdmin: boolean
    emailVerified: boolean
  }

  interface UserSession {
    /** Row id in user_sessions; sign-out revokes it, so a copied cookie stops working. */
    sessionId: string
  }
}

export {}

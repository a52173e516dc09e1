/**
 * The session user of nuxt-auth-utils (`useUserSession().user`, `getUserSession(event).user`).
 * Written by the sign-in routes (server/utils/auth.ts `startSession`); `sessionVersion` lets the
 * server end every session of a user at once (password change, deactivation).
 */
import type { Role } from './db'

declare module '#auth-utils' {
  interface User {
    id: number
    agencyId: number
    email: string
    name: string
    role: Role
    sessionVersion: number
  }
}

export {}

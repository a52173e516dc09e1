/**
 * Shapes of the JSON answers of the sign-in, account and administration routes
 * (server/api/auth/**, server/api/me*, server/api/admin/**). Dates are ISO 8601 strings.
 * The server maps models to these in server/utils/auth.ts (`userDto`, `agencyDto`, …); the
 * client never sees a model.
 */
import type { OutboxStatus, Role, TokenPurpose } from './db'

/** Every error answer: a sentence for people, and per-field problems for 422. */
export interface ApiErrorBody {
  message: string
  issues?: { path: string, message: string }[]
}

/** Answers that only confirm something. */
export interface ApiMessage { message: string }

/** The signed-in person, as sign-in and invitation acceptance return it. */
export interface SignedInUserDto {
  id: number
  agencyId: number
  email: string
  name: string
  role: Role
}

/** POST /api/auth/login, POST /api/auth/invite/accept */
export interface SignInResponse { user: SignedInUserDto }

/** GET /api/me */
export interface MeResponse {
  user: SignedInUserDto & { lastSignInAt: string | null }
  agency: { id: number, name: string, shortName: string }
}

/** invited: has not set a password yet; deactivated: may not sign in. */
export type UserStatus = 'invited' | 'active' | 'deactivated'

/** One user in the administration list. */
export interface AdminUserDto {
  id: number
  email: string
  name: string
  role: Role
  status: UserStatus
  active: boolean
  invitedAt: string | null
  lastSignInAt: string | null
  createdAt: string
  /** Send back with PATCH (optimistic locking). */
  version: number
}

/** GET /api/admin/users */
export interface AdminUserListResponse { items: AdminUserDto[] }

/** One queued or sent e-mail (administrators only). */
export interface OutboxMessageDto {
  id: number
  to: string
  subject: string
  text: string
  html: string | null
  status: OutboxStatus
  attempts: number
  nextAttemptAt: string
  lastError: string | null
  sentAt: string | null
  createdAt: string
}

/** A page of a longer list. */
export interface PagedResponse<T> {
  items: T[]
  page: number
  pageSize: number
  total: number
}

/** GET/PATCH /api/admin/agency */
export interface AgencyProfileDto {
  id: number
  name: string
  shortName: string
  address: string
  contactEmail: string | null
  phone: string | null
  updatedAt: string
  /** Send back with PATCH (optimistic locking). */
  version: number
}

/** GET /api/auth/tokens/:token — what an e-mailed link is for (only while it is valid). */
export interface TokenInfoResponse {
  purpose: TokenPurpose
  email: string
  name: string
  agencyName: string
  expiresAt: string
}

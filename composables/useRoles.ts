/**
 * How the four roles are named and explained in the interface. The server
 * decides what each role may do (server/utils/auth.ts requireRole); these
 * words only describe it, and the shell uses `canSee*` to hide what a role
 * cannot use. Keep the wording in step with PRODUCT.md "Roles and access".
 */
import type { Role } from '#shared/types/db'

/** A role name; the list itself lives in shared/types/db.ts (ROLES). */
export type RoleName = Role

export interface RoleDetail {
  value: RoleName
  label: string
  summary: string
  tone: 'river' | 'ochre' | 'reed' | 'neutral'
}

export const ROLE_DETAILS: readonly RoleDetail[] = [
  { value: 'administrator', label: 'Administrator', summary: 'Manages users, roles, the agency profile and the outbox. Can also do everything a manager can.', tone: 'ochre' },
  { value: 'manager', label: 'Manager', summary: 'Reviews proposals and approves, returns or declines them; edits data like a biologist.', tone: 'river' },
  { value: 'biologist', label: 'Biologist', summary: 'Keeps subpopulation records and writes proposals and scenarios.', tone: 'reed' },
  { value: 'viewer', label: 'Viewer', summary: 'Reads everything in the agency and comments; changes nothing.', tone: 'neutral' },
]

/** The detail for a role name; unknown names fall back to a neutral label. */
export function roleDetail(role: string | null | undefined): RoleDetail {
  return ROLE_DETAILS.find(detail => detail.value === role)
    ?? { value: 'viewer', label: role ? role.charAt(0).toUpperCase() + role.slice(1) : 'Unknown role', summary: '', tone: 'neutral' }
}

/** Administration is for administrators only (the server checks this too). */
export function canSeeAdministration(role: string | null | undefined): boolean {
  return role === 'administrator'
}

/** Managers and administrators decide on proposals; others read reviews only. */
export function canDecideReviews(role: string | null | undefined): boolean {
  return role === 'administrator' || role === 'manager'
}

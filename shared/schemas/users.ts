/**
 * Administration of users (server/api/admin/users/**) and the Outbox list: request schemas
 * shared by the routes and the administration forms.
 */
import { z } from 'zod'
import { OUTBOX_STATUSES, ROLES } from '../types/db'
import { EmailSchema, PersonNameSchema } from './auth'

/** One of the four roles. */
export const RoleSchema = z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}.` })

/** The `version` an edit was based on (optimistic locking). */
export const VersionSchema = z.number({ error: 'Send the version you loaded (a whole number).' })
  .int('Send the version you loaded (a whole number).')
  .min(0, 'Send the version you loaded (a whole number).')
  .max(2_147_483_647, 'Send the version you loaded (a whole number).')

/** POST /api/admin/users: invite someone. */
export const InviteUserSchema = z.object({
  email: EmailSchema,
  name: PersonNameSchema,
  role: RoleSchema,
})
export type InviteUserInput = z.infer<typeof InviteUserSchema>

/** PATCH /api/admin/users/:id: change role and/or active, based on `version`. */
export const UpdateUserSchema = z.object({
  role: RoleSchema.optional(),
  active: z.boolean({ error: 'active must be true or false.' }).optional(),
  version: VersionSchema,
}).refine(value => value.role !== undefined || value.active !== undefined, {
  message: 'Send a new role, a new active state, or both.',
})
export type UpdateUserInput = z.infer<typeof UpdateUserSchema>

/** GET /api/admin/outbox?status=&page= */
export const OutboxQuerySchema = z.object({
  /** '' (the "all" choice of a select) means no filter. */
  status: z.preprocess(
    value => (value === '' ? undefined : value),
    z.enum(OUTBOX_STATUSES, { error: `Choose a status: ${OUTBOX_STATUSES.join(', ')}.` }).optional(),
  ),
  page: z.coerce.number({ error: 'Must be a page number, like 2.' })
    .int('Must be a whole page number, like 2.')
    .min(1, 'Pages start at 1.')
    .max(100_000, 'Must be at most 100000.')
    .default(1),
})
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>

/**
 * The agency profile (letterhead) edited by administrators: PATCH /api/admin/agency and the
 * profile form.
 */
import { z } from 'zod'
import { EmailSchema } from './auth'
import { VersionSchema } from './users'

function limitedText(label: string, max: number) {
  return z.string({ error: `${label} must be text.` }).trim().max(max, `${label} has at most ${max} characters.`)
}

/** '' or null → null (clear the field); undefined stays undefined (leave it as it is). */
function clearable<T extends z.ZodType<string | null>>(schema: T) {
  return z.union([z.literal('').transform(() => null), z.null(), schema]).optional()
}

/**
 * PATCH /api/admin/agency, based on `version`. Name and short name are always sent; address,
 * contact e-mail and phone are changed when present ('' or null clears e-mail and phone).
 */
export const AgencyProfileSchema = z.object({
  name: limitedText('The agency name', 200).min(1, 'Enter the agency name.'),
  shortName: limitedText('The short name', 20).min(1, 'Enter a short name, like EUWS.'),
  address: limitedText('The postal address', 500).optional(),
  contactEmail: clearable(EmailSchema),
  phone: clearable(limitedText('The phone number', 40)),
  version: VersionSchema,
})
export type AgencyProfileInput = z.infer<typeof AgencyProfileSchema>

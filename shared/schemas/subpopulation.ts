/**
 * The subpopulation record as forms and routes accept it — one schema for both:
 *   - SubpopulationAttributesSchema: the attributes form (Atlas "new subpopulation" dialog and
 *     the subpopulation page's attributes section);
 *   - SubpopulationCreateSchema: POST /api/subpopulations (attributes + species + boundary);
 *   - SubpopulationPatchSchema: PATCH /api/subpopulations/:id (any subset + `version`);
 *   - BoundarySchema: a GeoJSON boundary, checked by shared/atlas/geometry-check.ts.
 * Units: generation time and years isolated in years, working Ne in individuals.
 * Forms convert their text inputs to numbers (or null for an empty optional field) before
 * validating; the messages name the units.
 */
import { z } from 'zod'
import { boundaryProblems } from '../atlas/geometry-check'
import type { SubpopulationGeometry } from '../atlas/types'

/** Longest name, environment class and reason we keep. */
export const SUBPOPULATION_LIMITS = {
  name: 120,
  environmentClass: 120,
  notes: 5000,
  workingNeReason: 2000,
  generationTimeYears: 100,
  yearsIsolated: 100_000,
  workingNe: 10_000_000,
} as const

const number = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a finite number.`)

/** A GeoJSON Polygon, MultiPolygon or Point that passes every boundary check. */
export const BoundarySchema = z.custom<SubpopulationGeometry>(value => typeof value === 'object' && value !== null, {
  message: 'The boundary must be a GeoJSON geometry: a Polygon, MultiPolygon or Point.',
}).superRefine((value, context) => {
  for (const message of boundaryProblems(value)) context.addIssue({ code: 'custom', message })
})

/** True when the text has a control character (tab, line break, NUL …): not allowed in names. */
function hasControlCharacter(text: string): boolean {
  for (const character of text) {
    const code = character.codePointAt(0) ?? 0
    if (code < 0x20 || code === 0x7f) return true
  }
  return false
}

const NameSchema = z.string({ error: 'Enter a name.' }).trim()
  .min(1, 'Enter a name.')
  .max(SUBPOPULATION_LIMITS.name, `The name has at most ${SUBPOPULATION_LIMITS.name} characters.`)
  .refine(text => !hasControlCharacter(text), 'The name cannot contain tabs, line breaks or other control characters.')

/** '' and null both mean "not given". */
const EnvironmentClassSchema = z.union([
  z.null(),
  z.string({ error: 'The environment class must be text.' }).trim()
    .max(SUBPOPULATION_LIMITS.environmentClass, `The environment class has at most ${SUBPOPULATION_LIMITS.environmentClass} characters.`)
    .transform(text => (text === '' ? null : text)),
])

const GenerationTimeSchema = number('The generation time')
  .refine(value => value > 0, 'The generation time must be more than 0 years.')
  .refine(value => value <= SUBPOPULATION_LIMITS.generationTimeYears, `The generation time must be at most ${SUBPOPULATION_LIMITS.generationTimeYears} years.`)

const YearsIsolatedSchema = z.union([
  z.null(),
  number('Years isolated')
    .refine(value => value >= 0, 'Years isolated cannot be negative.')
    .refine(value => value <= SUBPOPULATION_LIMITS.yearsIsolated, `Years isolated must be at most ${SUBPOPULATION_LIMITS.yearsIsolated.toLocaleString('en-US')}.`),
])

const NotesSchema = z.string({ error: 'Notes must be text.' }).trim()
  .max(SUBPOPULATION_LIMITS.notes, `Notes have at most ${SUBPOPULATION_LIMITS.notes} characters.`)

/**
 * The attributes a person types: name, environment class, generation time (years) and years
 * isolated. Environment class and years isolated may be null (not known).
 */
export const SubpopulationAttributesSchema = z.strictObject({
  name: NameSchema,
  environmentClass: EnvironmentClassSchema.default(null),
  generationTimeYears: GenerationTimeSchema,
  yearsIsolated: YearsIsolatedSchema.default(null),
  notes: NotesSchema.default(''),
})
export type SubpopulationAttributesInput = z.input<typeof SubpopulationAttributesSchema>
export type SubpopulationAttributes = z.output<typeof SubpopulationAttributesSchema>

/** POST /api/subpopulations: the attributes, the species and (optionally) a boundary. */
export const SubpopulationCreateSchema = SubpopulationAttributesSchema.extend({
  speciesId: z.number({ error: 'Choose a species.' }).int('Choose a species.').positive('Choose a species.'),
  geometry: BoundarySchema.nullable().default(null),
})
export type SubpopulationCreateInput = z.input<typeof SubpopulationCreateSchema>

const WorkingNeSchema = z.union([
  z.null(),
  number('The working Ne')
    .refine(value => value > 0, 'The working Ne must be more than 0 individuals.')
    .refine(value => value <= SUBPOPULATION_LIMITS.workingNe, `The working Ne must be at most ${SUBPOPULATION_LIMITS.workingNe.toLocaleString('en-US')} individuals.`),
])

const WorkingNeReasonSchema = z.union([
  z.null(),
  z.string({ error: 'The reason must be text.' }).trim()
    .max(SUBPOPULATION_LIMITS.workingNeReason, `The reason has at most ${SUBPOPULATION_LIMITS.workingNeReason} characters.`)
    .transform(text => (text === '' ? null : text)),
])

/** The version a PATCH or DELETE is based on (optimistic locking). */
export const RecordVersionSchema = z.number({ error: 'Send the version you loaded (a whole number).' })
  .int('Send the version you loaded (a whole number).')
  .min(0, 'Send the version you loaded (a whole number).')
  .max(2_147_483_647, 'Send the version you loaded (a whole number).')

/**
 * PATCH /api/subpopulations/:id: any of the attributes, the boundary (null removes it), the
 * working Ne with its reason (a working Ne needs a reason in the same request; null clears
 * both), and the `version` the change is based on.
 */
export const SubpopulationPatchSchema = z.strictObject({
  name: NameSchema.optional(),
  environmentClass: EnvironmentClassSchema.optional(),
  generationTimeYears: GenerationTimeSchema.optional(),
  yearsIsolated: YearsIsolatedSchema.optional(),
  notes: NotesSchema.optional(),
  geometry: BoundarySchema.nullable().optional(),
  workingNe: WorkingNeSchema.optional(),
  workingNeReason: WorkingNeReasonSchema.optional(),
  version: RecordVersionSchema,
}).superRefine((value, context) => {
  if (typeof value.workingNe === 'number' && !value.workingNeReason) {
    context.addIssue({ code: 'custom', path: ['workingNeReason'], message: 'Say why this is the working Ne (method, data, judgement).' })
  }
})
export type SubpopulationPatchInput = z.input<typeof SubpopulationPatchSchema>
export type SubpopulationPatch = z.output<typeof SubpopulationPatchSchema>

/** DELETE /api/subpopulations/:id?version=N */
export const SubpopulationDeleteQuerySchema = z.object({
  version: z.string({ error: 'Send the version you loaded (?version=N).' })
    .regex(/^\d{1,10}$/, 'Send the version you loaded (?version=N).')
    .transform(Number)
    .pipe(RecordVersionSchema),
})

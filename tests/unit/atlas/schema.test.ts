/**
 * The one subpopulation schema shared by the attributes form and the routes
 * (shared/schemas/subpopulation.ts): what it accepts, how it normalises, and its messages.
 */
import { describe, expect, it } from 'vitest'
import {
  SubpopulationAttributesSchema, SubpopulationCreateSchema, SubpopulationDeleteQuerySchema, SubpopulationPatchSchema,
} from '../../../shared/schemas/subpopulation'
import { readCsvImport } from '../../../shared/atlas/import-csv'

const messages = (result: { success: boolean, error?: { issues: { path: PropertyKey[], message: string }[] } }) =>
  Object.fromEntries((result.error?.issues ?? []).map(issue => [issue.path.join('.'), issue.message]))

describe('SubpopulationAttributesSchema', () => {
  it('trims text, turns an empty environment class into null and fills defaults', () => {
    expect(SubpopulationAttributesSchema.parse({ name: '  Laurel Fold ', environmentClass: '  ', generationTimeYears: 3 }))
      .toEqual({ name: 'Laurel Fold', environmentClass: null, generationTimeYears: 3, yearsIsolated: null, notes: '' })
  })

  it('says what is wrong, with units', () => {
    expect(messages(SubpopulationAttributesSchema.safeParse({ name: '', generationTimeYears: 0, yearsIsolated: -1 }))).toEqual({
      name: 'Enter a name.',
      generationTimeYears: 'The generation time must be more than 0 years.',
      yearsIsolated: 'Years isolated cannot be negative.',
    })
    expect(messages(SubpopulationAttributesSchema.safeParse({ name: 'A', generationTimeYears: 101 }))).toEqual({ generationTimeYears: 'The generation time must be at most 100 years.' })
    expect(messages(SubpopulationAttributesSchema.safeParse({ name: 'Line\nbreak', generationTimeYears: 2 })).name).toMatch(/control characters/)
    expect(SubpopulationAttributesSchema.safeParse({ name: 'A', generationTimeYears: 2, colour: 'red' }).success).toBe(false)
  })
})

describe('SubpopulationCreateSchema', () => {
  it('needs a species; the boundary is optional and checked', () => {
    expect(SubpopulationCreateSchema.parse({ speciesId: 4, name: 'A', generationTimeYears: 2 }).geometry).toBeNull()
    const crossing = SubpopulationCreateSchema.safeParse({ speciesId: 4, name: 'A', generationTimeYears: 2, geometry: { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] } })
    expect(messages(crossing).geometry).toMatch(/crosses itself/)
    expect(messages(SubpopulationCreateSchema.safeParse({ speciesId: 4, name: 'A', generationTimeYears: 2, geometry: 'x' })).geometry).toBe('The boundary must be a GeoJSON geometry: a Polygon, MultiPolygon or Point.')
  })
})

describe('SubpopulationPatchSchema', () => {
  it('needs the version; a working Ne needs its reason in the same request', () => {
    expect(SubpopulationPatchSchema.safeParse({ name: 'A' }).success).toBe(false)
    expect(messages(SubpopulationPatchSchema.safeParse({ workingNe: 40, version: 2 }))).toEqual({ workingNeReason: 'Say why this is the working Ne (method, data, judgement).' })
    expect(SubpopulationPatchSchema.parse({ workingNe: 40, workingNeReason: ' harmonic mean ', version: 2 })).toEqual({ workingNe: 40, workingNeReason: 'harmonic mean', version: 2 })
    expect(SubpopulationPatchSchema.parse({ workingNe: null, geometry: null, version: 0 })).toEqual({ workingNe: null, geometry: null, version: 0 })
  })

  it('reads the DELETE version from the query string', () => {
    expect(SubpopulationDeleteQuerySchema.parse({ version: '3' })).toEqual({ version: 3 })
    expect(SubpopulationDeleteQuerySchema.safeParse({ version: '-1' }).success).toBe(false)
    expect(SubpopulationDeleteQuerySchema.safeParse({}).success).toBe(false)
  })
})

describe('imports that may update', () => {
  it('leave a missing generation time to the importer (new records still need one there)', () => {
    const reading = readCsvImport('name,latitude,longitude\nA,35.5,-83.5', { requireGenerationTime: false })
    expect(reading.issues).toEqual([])
    expect(reading.records[0]?.attributes.generationTimeYears).toBeNull()
    expect(readCsvImport('name,latitude,longitude\nA,35.5,-83.5').issues[0]?.message).toMatch(/^Row 2 \("A"\): generation_time_years is missing; give it in the file or set a default generation time for the import\.$/)
  })
})

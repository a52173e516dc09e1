/**
 * POST /api/species/:id/subpopulations/import
 *   { format: 'geojson' | 'csv', text, defaultGenerationTimeYears?, onExisting?: 'error' | 'update' }
 *   → 201 ImportResponse { created, updated, items }.
 * GeoJSON: a FeatureCollection whose features carry a Polygon, MultiPolygon or Point and a
 * `name` (plus optional attributes) in `properties`. CSV: columns name, latitude, longitude
 * (+ optional attributes). Everything or nothing: any problem answers 422 with one issue per
 * feature or row (`{ path, message, feature | row }`) and stores nothing; the stores happen in
 * one transaction. A name that exists already is a problem unless `onExisting` is 'update'
 * (then the boundary and the attributes the file gives replace the stored ones).
 * 413 above 5 MB. 404 for another agency's species. Biologists, managers and administrators.
 */
import { z } from 'zod'
import type { ImportResponse } from '#shared/atlas/types'
import { ATLAS_WRITERS, ownSpecies } from '../../../../atlas/records'
import { importRecords, readImportFile } from '../../../../atlas/import'
import { SUBPOPULATION_IMPORT_MAX_BYTES as MAX_IMPORT_BYTES } from '#shared/schemas/request-limits'

const BodySchema = z.strictObject({
  format: z.enum(['geojson', 'csv'], { error: 'Choose the file format: "geojson" or "csv".' }),
  text: z.string({ error: 'Send the file\'s text in "text".' }).min(1, 'The file is empty.'),
  defaultGenerationTimeYears: z.number({ error: 'The default generation time must be a number of years.' })
    .positive('The default generation time must be more than 0 years.')
    .max(100, 'The default generation time must be at most 100 years.')
    .nullable().optional(),
  onExisting: z.enum(['error', 'update'], { error: 'onExisting is "error" or "update".' }).default('error'),
})

export default defineEventHandler(async (event): Promise<ImportResponse> => {
  const user = await requireRole(event, ...ATLAS_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const body = await readBodyWith(event, BodySchema, { maxBytes: MAX_IMPORT_BYTES })
  const db = await useDb()
  const species = await ownSpecies(db.models, user.agencyId, id)
  const reading = readImportFile(body.format, body.text, body.defaultGenerationTimeYears ?? null, body.onExisting)
  const result = await importRecords(db, { user, species, reading, onExisting: body.onExisting })
  setResponseStatus(event, 201)
  return result
})

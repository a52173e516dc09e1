/**
 * The invented demo data set (agency.json, subpopulations.json), read and checked against a
 * schema so a typo in the data fails loudly at seed time rather than as a half-made record.
 */
import type { MultiPolygon, Point, Polygon } from 'geojson'
import { z } from 'zod'
import { ROLES } from '../../shared/types/db'
import agencyJson from './agency.json'
import subpopulationsJson from './subpopulations.json'

const Position = z.tuple([z.number().min(-180).max(180), z.number().min(-90).max(90)])

const Geometry = z.discriminatedUnion('type', [
  z.object({ type: z.literal('Polygon'), coordinates: z.array(z.array(Position).min(4)).min(1) }),
  z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(z.array(z.array(Position).min(4)).min(1)).min(1) }),
  z.object({ type: z.literal('Point'), coordinates: Position }),
])

const CensusRow = z.object({
  year: z.number().int(),
  adults: z.number().int().nonnegative(),
  males: z.number().int().nonnegative().optional(),
  females: z.number().int().nonnegative().optional(),
})

const Estimate = z.object({
  method: z.string().min(1),
  inputs: z.record(z.string(), z.unknown()),
  value: z.number().positive(),
  intervalLow: z.number().nonnegative().optional(),
  intervalHigh: z.number().positive().optional(),
  estimatedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
})

const DemoSubpopulation = z.object({
  name: z.string().min(1),
  environmentClass: z.string().min(1),
  yearsIsolated: z.number().nonnegative(),
  generationTimeYears: z.number().positive(),
  workingNe: z.number().positive().nullable(),
  workingNeReason: z.string().min(1).nullable(),
  notes: z.string(),
  censusMethod: z.string().min(1),
  geometry: Geometry,
  census: z.array(CensusRow).min(1),
  estimates: z.array(Estimate).min(1),
})

const SubpopulationsFile = z.object({
  about: z.string(),
  source: z.string().min(1),
  subpopulations: z.array(DemoSubpopulation).min(1),
})

const AgencyFile = z.object({
  about: z.string(),
  agency: z.object({
    name: z.string().min(1),
    shortName: z.string().min(1),
    address: z.string(),
    contactEmail: z.string().email(),
    phone: z.string(),
  }),
  password: z.string().min(8),
  users: z.array(z.object({ email: z.string().email(), name: z.string().min(1), role: z.enum(ROLES) })).min(1),
  species: z.object({ commonName: z.string().min(1), scientificName: z.string().min(1), notes: z.string(), invented: z.boolean() }),
})

export type DemoSubpopulationData = Omit<z.infer<typeof DemoSubpopulation>, 'geometry'> & { geometry: Polygon | MultiPolygon | Point }

export interface DemoData {
  agency: z.infer<typeof AgencyFile>['agency']
  password: string
  users: z.infer<typeof AgencyFile>['users']
  species: z.infer<typeof AgencyFile>['species']
  /** Provenance written into every census row and estimate. */
  source: string
  subpopulations: DemoSubpopulationData[]
}

/** Parses and checks the demo data files. */
export function loadDemoData(): DemoData {
  const agencyFile = AgencyFile.parse(agencyJson)
  const subpopulationsFile = SubpopulationsFile.parse(subpopulationsJson)
  return {
    agency: agencyFile.agency,
    password: agencyFile.password,
    users: agencyFile.users,
    species: agencyFile.species,
    source: subpopulationsFile.source,
    subpopulations: subpopulationsFile.subpopulations as DemoSubpopulationData[],
  }
}

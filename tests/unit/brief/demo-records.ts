/**
 * Brief records for unit tests and the benchmark, built from the invented demo data
 * (seeds/demo/subpopulations.json): Fernwhistle Creek as recipient, Lanternmoss Gap as source,
 * the other demo subpopulations as map context, a "No action" baseline and two release
 * scenarios. Invented data throughout; no database.
 */
import { readFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import type { Geometry } from 'geojson'
import { loadDemoData } from '../../../seeds/demo/data'
import type { BriefRecords, SubpopulationRecord } from '../../../server/brief/assemble'
import { ensureBriefFonts } from '../../../server/brief/fonts'
import { baselineScenarioInputs, defaultScenarioInputs } from '../../../shared/schemas/scenario'

const fontDirectory = fileURLToPath(new URL('../../../server/assets/fonts/', import.meta.url))

/** The brief fonts, read from the source tree (the built server reads its server assets). */
export function testFonts() {
  return ensureBriefFonts(name => readFile(`${fontDirectory}${name}`))
}

function centroidOf(geometry: Geometry): [number, number] {
  const ring = geometry.type === 'Polygon' ? geometry.coordinates[0] ?? [] : geometry.type === 'Point' ? [geometry.coordinates] : []
  let lon = 0
  let lat = 0
  for (const position of ring) {
    lon += position[0] ?? 0
    lat += position[1] ?? 0
  }
  return [lon / Math.max(ring.length, 1), lat / Math.max(ring.length, 1)]
}

/** The demo subpopulations as records (ids 1…n in file order). */
export function demoSubpopulations(): SubpopulationRecord[] {
  return loadDemoData().subpopulations.map((sub, index) => {
    const latest = sub.census[sub.census.length - 1] ?? null
    return {
      id: index + 1,
      name: sub.name,
      geometry: sub.geometry as Geometry,
      centroid: centroidOf(sub.geometry as Geometry),
      areaKm2: 12.5 + index,
      latestCensus: latest ? { year: latest.year, adults: latest.adults } : null,
      workingNe: sub.workingNe ?? (latest ? Math.round(latest.adults * 0.1) : null),
      workingNeNote: sub.workingNeReason ?? '0.1 × latest census (Frankham 1995), no working Ne chosen.',
      generationTimeYears: sub.generationTimeYears,
      yearsIsolated: sub.yearsIsolated,
      environmentClass: sub.environmentClass,
    }
  })
}

/** A complete set of records for one approved proposal (override fields as needed). */
export function demoBriefRecords(overrides: Partial<BriefRecords> = {}): BriefRecords {
  const subs = demoSubpopulations()
  const recipient = subs.find(sub => sub.name === 'Fernwhistle Creek')!
  const source = subs.find(sub => sub.name === 'Lanternmoss Gap')!
  const others = subs.filter(sub => sub !== recipient && sub !== source)
  const second = defaultScenarioInputs(source.id)
  return {
    documentId: '6f1c2b4e-9d3a-4c5e-8f7a-1b2c3d4e5f60',
    issuedAt: '2026-03-14T15:30:00.000Z',
    verifyUrl: 'http://localhost:3000/verify',
    agency: {
      name: 'Eastern Uplands Wildlife Service',
      shortName: 'EUWS',
      address: 'Headwaters Building, 1 Laurel Run Way\nRidgeford (invented address)',
      contactEmail: 'conservation@demo.tributary.test',
      phone: '+1 555 0100',
      logo: null,
    },
    species: { commonName: 'Mistridge salamander', scientificName: 'Nephelotriton appalachiensis', invented: true },
    proposal: {
      id: 7,
      title: 'Genetic rescue for Fernwhistle Creek',
      purpose: 'Reduce inbreeding and restore lost genetic variation in Fernwhistle Creek by moving a few adults from Lanternmoss Gap (invented demo).',
      status: 'approved',
      captiveSource: null,
      narrative: {
        rationale: 'Fernwhistle Creek has been cut off for about 150 years and its working Ne is about 3 (invented demo figures). Inbreeding is expected to be high and rising.',
        monitoringPlan: 'Mark every released adult; count adults and juveniles each autumn for at least three generations.',
        risksAndMitigations: 'Disease transfer (screen every animal); failure of released animals to breed (release in spring).',
        permitsNeeded: 'State scientific collection permit; landholder consent for the release site.',
        recommendationReason: 'Scenario B restores the most gene flow for the fewest animals.',
      },
      outbreedingAnswers: {
        sameSpecies: { value: true, prefilledFrom: 'species of recipient and source' },
        fixedChromosomalDifferences: { value: false, overrideReason: 'Karyotypes checked in 2024 (invented).' },
        geneFlowWithin500Years: { value: true, prefilledFrom: 'years isolated: 150 and 5' },
        similarEnvironments: { value: 'unknown' },
      },
      recommendedScenarioId: 3,
      submittedAt: '2026-03-01T09:00:00.000Z',
      decidedAt: '2026-03-14T15:29:00.000Z',
    },
    recipient,
    sources: [source],
    others,
    scenarios: [
      { id: 1, name: 'No action', isBaseline: true, inputs: baselineScenarioInputs() },
      { id: 2, name: 'Scenario A', isBaseline: false, inputs: defaultScenarioInputs(source.id) },
      { id: 3, name: 'Scenario B', isBaseline: false, inputs: { ...second, schedule: { animalsPerEvent: 6, females: 3, males: 3, intervalYears: 4, events: 5, firstEventYear: 0 } } },
    ],
    author: { name: 'Robin Okafor', email: 'biologist@demo.tributary.test' },
    reviewer: { name: 'Morgan Ellery', email: 'manager@demo.tributary.test' },
    decision: { decision: 'approve', comment: 'Approved with the monitoring plan as written.', decidedAt: '2026-03-14T15:29:00.000Z', decidedBy: { name: 'Morgan Ellery', email: 'manager@demo.tributary.test' } },
    ...overrides,
  }
}

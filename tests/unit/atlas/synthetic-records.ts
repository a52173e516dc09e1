/**
 * Invented subpopulation records in bulk, for the 1,000-record list tests and
 * bench/atlas.bench.ts. Deterministic: a small linear congruential generator seeded by the
 * caller (no Math.random), so every run sees the same records.
 */
import type { Polygon } from 'geojson'
import type { SubpopulationDto } from '../../../shared/atlas/types'
import { subpopulationStatus, workingEffectiveSize } from '../../../shared/atlas/working-effective-size'

/** Numerical Recipes LCG (a = 1664525, c = 1013904223, m = 2³²), values in [0, 1). */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0
    return state / 2 ** 32
  }
}

const SYLLABLES = ['ash', 'fern', 'moss', 'brook', 'ridge', 'hollow', 'gap', 'knob', 'cove', 'bald', 'laurel', 'spring', 'run', 'fork', 'glade']

function hexagon(lon: number, lat: number, radiusDegrees: number): Polygon {
  const ring: [number, number][] = []
  for (let k = 0; k < 6; k += 1) {
    const angle = (Math.PI / 3) * k
    ring.push([lon + radiusDegrees * Math.cos(angle), lat + radiusDegrees * 0.8 * Math.sin(angle)])
  }
  ring.push(ring[0] as [number, number])
  return { type: 'Polygon', coordinates: [ring] }
}

/**
 * `count` invented records spread over the southern Appalachians (about 83–85° W, 34.5–36.5° N),
 * with a mix of working Ne, estimates, census-only and empty records.
 */
export function syntheticRecords(count: number, seed = 1): SubpopulationDto[] {
  const random = seededRandom(seed)
  const records: SubpopulationDto[] = []
  for (let i = 0; i < count; i += 1) {
    const lon = -85 + random() * 2
    const lat = 34.5 + random() * 2
    const name = `${SYLLABLES[Math.floor(random() * SYLLABLES.length)]}${SYLLABLES[Math.floor(random() * SYLLABLES.length)]} ${i + 1}`
    const adults = Math.round(10 ** (1 + random() * 3))
    const kind = random()
    const workingNe = kind < 0.3 ? Math.round(adults * (0.05 + random() * 0.3)) || 1 : null
    const latestEstimate = kind >= 0.3 && kind < 0.7 ? { id: i + 1, method: 'harmonic-mean', value: Math.max(1, adults * 0.2), estimatedOn: '2025-01-01' } : null
    const latestCensus = kind < 0.95 ? { year: 2024, adults } : null
    const effectiveSize = workingEffectiveSize({ workingNe, workingNeReason: workingNe ? 'invented' : null, latestEstimate, latestCensus })
    records.push({
      id: i + 1,
      speciesId: 1,
      name: name.charAt(0).toUpperCase() + name.slice(1),
      geometry: hexagon(lon, lat, 0.02 + random() * 0.05),
      centroid: { lon, lat },
      areaKm2: 10,
      environmentClass: random() < 0.5 ? 'cove forest' : 'spruce-fir summit',
      yearsIsolated: Math.round(random() * 100),
      generationTimeYears: 3,
      workingNe,
      workingNeReason: workingNe ? 'invented' : null,
      notes: '',
      latestCensus,
      latestEstimate,
      effectiveSize,
      status: subpopulationStatus(effectiveSize),
      createdAt: '2025-01-01T00:00:00.000Z',
      updatedAt: '2025-01-01T00:00:00.000Z',
      version: 0,
    })
  }
  return records
}

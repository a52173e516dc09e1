/**
 * Everything a brief shows, gathered once (server/utils/brief-service.ts `loadBriefData`) and
 * turned into a PDF by `buildBriefDocument` (./document.ts) without further database access.
 *
 * Plain data: numbers are already computed, texts already chosen, dates are ISO strings. The
 * same object always gives the same document (the only clock is `issuedAt`), so a brief can be
 * rebuilt from it and tests can build one from a literal.
 */
import type { Geometry } from 'geojson'

/** The agency letterhead. */
export interface BriefAgency {
  name: string
  shortName: string
  /** Postal address; may span lines. */
  address: string
  contactEmail: string | null
  phone: string | null
  /** The uploaded letterhead logo, when there is one. */
  logo: { contentType: 'image/png' | 'image/jpeg', base64: string } | null
}

export interface BriefSpecies {
  commonName: string
  scientificName: string
  /** Demo data: printed as "invented" so nobody takes it for a real species. */
  invented: boolean
}

/** One subpopulation as the map and the data table show it. */
export interface BriefSubpopulation {
  id: number
  name: string
  /** 'other' = a subpopulation of the same species not involved, drawn faintly for context. */
  role: 'recipient' | 'source' | 'other'
  geometry: Geometry | null
  /** [longitude, latitude] in degrees, or null when the record has no location. */
  centroid: [number, number] | null
  areaKm2: number | null
  latestCensus: { year: number, adults: number } | null
  workingNe: number | null
  workingNeReason: string | null
  generationTimeYears: number
  yearsIsolated: number | null
  environmentClass: string | null
  /** Great-circle distance between centroids, km; null for the recipient or without locations. */
  distanceToRecipientKm: number | null
}

/** Establishment of one adaptive variant under one scenario. */
export interface BriefEstablishment {
  variantName: string
  /** q, frequency of the variant in the source. */
  sourceFrequency: number
  s: number
  h: number
  /** Mean gene copies one release carries, 2k·q. */
  meanCopiesPerRelease: number
  /** Releases before the horizon that count as chances. */
  releasesCounted: number
  /** Probability that one release establishes the variant. */
  perRelease: number
  /** Probability that at least one release establishes it (the headline figure). */
  overSchedule: number
  /** The same over the corners of the plausible s and h ranges. */
  range: { low: number, high: number }
  /** Mean years to establishment from the first release, given that it happens; null if none. */
  meanTimeYears: number | null
  /** 'exact Wright–Fisher chain (M = 346)' or 'diffusion (Kimura 1962)'. */
  method: string
  /** Plain-words warnings (method out of its comfortable range), possibly empty. */
  warnings: string[]
}

/** Where a quantity stands at the horizon. */
export interface BriefHorizonFigures {
  inbreeding: number
  heterozygosity: number
  fitness: number
}

/** One point of a scenario's projection. */
export interface BriefProjectionPoint {
  years: number
  inbreeding: number
  heterozygosity: number
  fitness: number
}

/** A scenario and its results, ready to print. */
export interface BriefScenario {
  id: number
  name: string
  isBaseline: boolean
  recommended: boolean
  /** "4 animals (2 females, 2 males) every 5 years, 3 releases from year 0", or "No animals moved". */
  scheduleText: string
  sourceName: string | null
  horizonYears: number
  /** Census N, Ne and generation time used (from the record or the scenario's what-ifs). */
  recipientCensus: number
  recipientEffectiveSize: number
  generationTimeYears: number
  initialInbreeding: number
  diploidLethalEquivalents: number
  loadCitation: string
  /** Effective migrants per generation while releases continue, Ne·m; 0 for no action. */
  migrantsPerGeneration: number
  /** Animals moved over the whole schedule. */
  animalsMoved: number
  atHorizon: BriefHorizonFigures
  projection: BriefProjectionPoint[]
  establishment: BriefEstablishment[]
  /** Non-fatal problems met while computing (an input outside a method's domain …). */
  notes: string[]
}

/** One answer of the outbreeding-depression screen. */
export interface BriefScreenAnswer {
  question: string
  answer: 'yes' | 'no' | 'unknown'
  /** Why the author answered so (may be empty). */
  note: string
}

export interface BriefOutbreeding {
  level: 'low' | 'elevated'
  reasons: string[]
  answers: BriefScreenAnswer[]
  sourceName: string | null
}

/** A method or a caution printed in the methods section. */
export interface BriefNote {
  title: string
  text: string
  /** The formula in the usual notation, when there is one. */
  formula?: string
  assumptions?: string[]
  /** Papers (or "common practice, no source") behind it. */
  sources: string[]
}

export interface BriefPerson {
  name: string
  email: string | null
}

/** Who wrote, reviewed and decided, and when. */
export interface BriefDecision {
  author: BriefPerson
  reviewer: BriefPerson | null
  approver: BriefPerson | null
  submittedAt: string | null
  decidedAt: string | null
  decision: 'approve' | 'return' | 'decline' | null
  comment: string | null
}

/** Narrative sections written by the author. Empty strings are printed as "Not stated". */
export interface BriefNarrative {
  purpose: string
  rationale: string
  monitoringPlan: string
  risks: string
  permits: string
}

export interface BriefData {
  /** Printed on every page and recorded with the issued file (UUID). */
  documentId: string
  /** When this document was built (ISO 8601). */
  issuedAt: string
  /** Public address of the verify page, e.g. https://tributary.example/verify. */
  verifyUrl: string
  agency: BriefAgency
  proposal: {
    id: number
    title: string
    status: string
    /** Reference printed on the cover, e.g. 'EUWS-P-12'. */
    reference: string
  }
  species: BriefSpecies
  recipient: BriefSubpopulation
  sources: BriefSubpopulation[]
  /** Other subpopulations of the species (map context only). */
  others: BriefSubpopulation[]
  captiveSource: string | null
  narrative: BriefNarrative
  /** The recommendation in a few sentences (built from the recommended scenario). */
  recommendation: string[]
  scenarios: BriefScenario[]
  outbreeding: BriefOutbreeding | null
  methods: BriefNote[]
  cautions: BriefNote[]
  decision: BriefDecision
}

/** Options of `buildBriefDocument`. */
export interface BriefBuildOptions {
  /** A preview before approval: "Draft — not approved" on every page, no signature. */
  draft: boolean
}

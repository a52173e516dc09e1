/**
 * Records → BriefData: runs every scenario through `computeScenarioResults`
 * (shared/proposals/results.ts — the same function the workspace and the calc route use, so the
 * brief prints the numbers people saw on screen), writes the recommendation sentences, picks
 * the methods and cautions that apply, and shapes the outbreeding screen. Pure: the database
 * side is server/utils/brief-service.ts.
 */
import type { Geometry } from 'geojson'
import { CAUTIONS, PUBLISHED_LETHAL_EQUIVALENTS, outbreedingRisk, type CautionId, type OutbreedingQuestion, type ScreenAnswer } from '../../shared/genetics'
import { computeScenarioResults } from '../../shared/proposals/results'
import { rememberedExactVector } from '../utils/exact-chain-memo'
import { EXPLANATIONS, type ExplanationId } from '../../shared/proposals/explanations'
import type { ScenarioInputsLike, ScenarioResults, VariantEstablishment } from '../../shared/proposals/types'
import { OUTBREEDING_QUESTIONS } from '../../shared/schemas/proposal'
import { greatCircleKm } from '../../shared/atlas/spherical'
import { formatChange, formatFitness, formatFixed, formatMigrants, formatProbability, formatYears, plural } from './format'
import type {
  BriefAgency, BriefData, BriefDecision, BriefEstablishment, BriefNarrative, BriefNote, BriefOutbreeding,
  BriefPerson, BriefScenario, BriefSpecies, BriefSubpopulation,
} from './types'

/** A subpopulation as read from the records. */
export interface SubpopulationRecord {
  id: number
  name: string
  geometry: Geometry | null
  centroid: [number, number] | null
  areaKm2: number | null
  latestCensus: { year: number, adults: number } | null
  /** Resolved like the Atlas: working Ne, else the latest estimate, else 0.1 × census. */
  workingNe: number | null
  /** Why that figure (the biologist's reason, or how it was resolved). */
  workingNeNote: string | null
  generationTimeYears: number
  yearsIsolated: number | null
  environmentClass: string | null
}

export interface ScenarioRecord {
  id: number
  name: string
  isBaseline: boolean
  inputs: ScenarioInputsLike
}

/** Everything `assembleBriefData` reads. */
export interface BriefRecords {
  documentId: string
  issuedAt: string
  verifyUrl: string
  agency: BriefAgency
  species: BriefSpecies
  proposal: {
    id: number
    title: string
    purpose: string
    status: string
    captiveSource: string | null
    narrative: Record<string, unknown>
    outbreedingAnswers: Record<string, unknown>
    recommendedScenarioId: number | null
    submittedAt: string | null
    decidedAt: string | null
  }
  recipient: SubpopulationRecord
  sources: SubpopulationRecord[]
  others: SubpopulationRecord[]
  scenarios: ScenarioRecord[]
  author: BriefPerson
  reviewer: BriefPerson | null
  /** The latest decision on the proposal, if any. */
  decision: { decision: 'approve' | 'return' | 'decline', comment: string, decidedAt: string, decidedBy: BriefPerson } | null
}

/** Methods printed in every brief, in this order. */
const METHOD_IDS: readonly ExplanationId[] = [
  'establishment.headline',
  'establishment.diffusion',
  'establishment.exact',
  'time.establishment',
  'projection.inbreeding',
  'projection.fitness',
  'migrants.effective',
  'migrants.rule',
  'load.lethalEquivalents',
  'outbreeding.level',
]

const text = (value: unknown): string => (typeof value === 'string' ? value : '')

function narrativeOf(records: BriefRecords): BriefNarrative {
  const narrative = records.proposal.narrative
  return {
    purpose: records.proposal.purpose,
    rationale: text(narrative.rationale),
    monitoringPlan: text(narrative.monitoringPlan),
    risks: text(narrative.risksAndMitigations),
    permits: text(narrative.permitsNeeded),
  }
}

function subpopulation(record: SubpopulationRecord, role: BriefSubpopulation['role'], recipientCentroid: [number, number] | null): BriefSubpopulation {
  return {
    id: record.id,
    name: record.name,
    role,
    geometry: record.geometry,
    centroid: record.centroid,
    areaKm2: record.areaKm2,
    latestCensus: record.latestCensus,
    workingNe: record.workingNe,
    workingNeReason: record.workingNeNote,
    generationTimeYears: record.generationTimeYears,
    yearsIsolated: record.yearsIsolated,
    environmentClass: record.environmentClass,
    distanceToRecipientKm: role !== 'recipient' && record.centroid && recipientCentroid ? greatCircleKm(record.centroid, recipientCentroid) : null,
  }
}

type Schedule = ScenarioInputsLike['schedule']

function movesAnimals(schedule: Schedule): schedule is NonNullable<Schedule> {
  return schedule !== null && schedule.events >= 1 && schedule.animalsPerEvent >= 1
}

function animalsText(schedule: NonNullable<Schedule>): string {
  return `${plural(schedule.animalsPerEvent, 'animal', 'animals')} (${plural(schedule.females, 'female', 'females')}, ${plural(schedule.males, 'male', 'males')})`
}

/** "every 5 years, 3 releases starting now" / "once, in year 2". */
function cadenceText(schedule: NonNullable<Schedule>): string {
  const first = schedule.firstEventYear ?? 0
  if (schedule.events === 1) return first === 0 ? 'once, now' : `once, in year ${formatYears(first)}`
  return `every ${formatYears(schedule.intervalYears)} years, ${schedule.events} releases starting ${first === 0 ? 'now' : `in year ${formatYears(first)}`}`
}

/**
 * The schedule in words.
 *
 * @example scheduleText({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 })
 *   // '4 animals (2 females, 2 males) every 5 years, 3 releases starting now'
 * @example scheduleText(null) // 'No animals moved'
 */
export function scheduleText(schedule: Schedule): string {
  if (!movesAnimals(schedule)) return 'No animals moved'
  return `${animalsText(schedule)} ${cadenceText(schedule)}`
}

function loadCitation(citation: string): string {
  const published = (PUBLISHED_LETHAL_EQUIVALENTS as Record<string, { source: string } | undefined>)[citation]
  return published?.source ?? 'The team\'s own figure (no published source given).'
}

function cautionTitles(ids: readonly CautionId[]): string[] {
  return [...new Set(ids)].map(id => CAUTIONS[id].title)
}

function establishmentOf(item: VariantEstablishment, inputs: ScenarioInputsLike): BriefEstablishment {
  const variant = inputs.variants[item.index]
  const method = item.headline.method === 'exact' && item.exact.status === 'computed'
    ? `exact Wright–Fisher chain (M = ${item.exact.chainSize})`
    : 'diffusion (Kimura 1962)'
  const perRelease = item.headline.method === 'exact' && item.exact.status === 'computed' ? item.exact.singleRelease : item.diffusion.singleRelease
  const warnings = cautionTitles(item.warnings)
  return {
    variantName: item.name,
    sourceFrequency: variant?.sourceFrequency ?? 0,
    s: variant?.s ?? 0,
    h: variant?.h ?? 0,
    meanCopiesPerRelease: item.copiesDistribution.mean,
    releasesCounted: item.releasesCounted,
    perRelease,
    overSchedule: item.headline.probability,
    range: { low: item.range.low, high: item.range.high },
    meanTimeYears: item.time ? item.time.fromFirstReleaseYears : null,
    method,
    warnings,
  }
}

/** Animals released before the horizon (those the projection counts). */
function animalsMoved(results: ScenarioResults): number {
  return results.projection.releases.reduce((sum, release) => sum + release.animals, 0)
}

interface ComputedScenario { scenario: BriefScenario, results: ScenarioResults | null }

function computeScenario(record: ScenarioRecord, records: BriefRecords, recommendedId: number | null): ComputedScenario {
  const recipient = records.recipient
  const source = records.sources.find(candidate => candidate.id === record.inputs.sourceSubpopulationId)
  const base = {
    id: record.id,
    name: record.name,
    isBaseline: record.isBaseline,
    recommended: record.id === recommendedId,
    scheduleText: scheduleText(record.inputs.schedule),
    sourceName: source?.name ?? (record.inputs.schedule && records.proposal.captiveSource ? records.proposal.captiveSource : null),
    horizonYears: record.inputs.horizonYears,
    diploidLethalEquivalents: record.inputs.load.diploidLethalEquivalents,
    loadCitation: loadCitation(record.inputs.load.citation),
  }
  const census = recipient.latestCensus?.adults ?? null
  const effectiveSize = recipient.workingNe
  const empty: BriefScenario = {
    ...base,
    recipientCensus: record.inputs.recipientOverrides?.census ?? census ?? 0,
    recipientEffectiveSize: record.inputs.recipientOverrides?.effectiveSize ?? effectiveSize ?? 0,
    generationTimeYears: record.inputs.recipientOverrides?.generationTimeYears ?? recipient.generationTimeYears,
    initialInbreeding: record.inputs.recipientOverrides?.initialInbreeding ?? 0,
    migrantsPerGeneration: 0,
    animalsMoved: 0,
    atHorizon: { inbreeding: Number.NaN, heterozygosity: Number.NaN, fitness: Number.NaN },
    projection: [],
    establishment: [],
    notes: [],
  }
  const overrides = record.inputs.recipientOverrides ?? {}
  if ((census === null && overrides.census === undefined) || (effectiveSize === null && overrides.effectiveSize === undefined)) {
    return { scenario: { ...empty, notes: ['The recipient has no census count or effective size on record, so no results could be computed.'] }, results: null }
  }
  let results: ScenarioResults
  try {
    results = computeScenarioResults({
      recipient: { census: census ?? 1, effectiveSize: effectiveSize ?? 1, generationTimeYears: recipient.generationTimeYears, initialInbreeding: 0 },
      inputs: record.inputs,
      outbreedingAnswers: null,
    }, { exactVector: rememberedExactVector })
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error)
    return { scenario: { ...empty, notes: [`The results could not be computed: ${reason}`] }, results: null }
  }
  const projection = results.projection
  const series = results.hasRelease ? projection.withAction : projection.withoutAction
  const points = projection.years.map((years, index) => ({
    years,
    inbreeding: series.inbreeding[index] ?? Number.NaN,
    heterozygosity: series.heterozygosity[index] ?? Number.NaN,
    fitness: series.fitness[index] ?? Number.NaN,
  }))
  const last = points[points.length - 1]
  const notes: string[] = []
  if (projection.releasesAfterHorizon > 0) notes.push(`${plural(projection.releasesAfterHorizon, 'release falls', 'releases fall')} at or after the horizon and ${projection.releasesAfterHorizon === 1 ? 'is' : 'are'} not counted.`)
  if (results.migrantsPerGeneration.oneOff && results.hasRelease) notes.push('A single release: the one-migrant-per-generation rule is about continuing gene flow, so Ne·m describes the generation of the release only.')
  for (const item of results.establishment) if (item.error) notes.push(`${item.name}: ${item.error}`)
  const cautionIds = [...results.warnings, ...results.establishment.flatMap(item => item.warnings)]
  if (cautionIds.length > 0) notes.push(`Cautions that apply (section 5): ${cautionTitles(cautionIds).map(title => title.charAt(0).toLowerCase() + title.slice(1)).join('; ')}.`)
  return {
    scenario: {
      ...empty,
      recipientCensus: results.recipient.census,
      recipientEffectiveSize: results.recipient.effectiveSize,
      generationTimeYears: results.recipient.generationTimeYears,
      initialInbreeding: results.recipient.initialInbreeding,
      migrantsPerGeneration: results.hasRelease ? results.migrantsPerGeneration.effectiveMigrants : 0,
      animalsMoved: animalsMoved(results),
      atHorizon: last ? { inbreeding: last.inbreeding, heterozygosity: last.heterozygosity, fitness: last.fitness } : empty.atHorizon,
      projection: points,
      establishment: results.establishment.map(item => establishmentOf(item, record.inputs)),
      notes,
    },
    results,
  }
}

function screenOf(records: BriefRecords): BriefOutbreeding | null {
  const stored = records.proposal.outbreedingAnswers
  const values = {} as Record<OutbreedingQuestion, ScreenAnswer>
  let any = false
  const answers = OUTBREEDING_QUESTIONS.map((info) => {
    const entry = stored[info.id] as { value?: unknown, prefilledFrom?: unknown, overrideReason?: unknown } | undefined
    const value = entry?.value
    const answer: ScreenAnswer = value === true || value === false ? value : 'unknown'
    if (entry !== undefined) any = true
    values[info.id] = answer
    const note = text(entry?.overrideReason) || (text(entry?.prefilledFrom) ? `From the records: ${text(entry?.prefilledFrom)}` : '')
    return { question: info.question, answer: answer === 'unknown' ? 'unknown' as const : answer ? 'yes' as const : 'no' as const, note }
  })
  if (!any) return null
  const risk = outbreedingRisk(values)
  const names = [...records.sources.map(source => source.name), ...(records.proposal.captiveSource ? [records.proposal.captiveSource] : [])]
  return { level: risk.level, reasons: [...risk.reasons], answers, sourceName: names.length ? names.join(', ') : null }
}

function recommendationOf(records: BriefRecords, scenarios: readonly BriefScenario[], screen: BriefOutbreeding | null): string[] {
  const chosen = scenarios.find(scenario => scenario.recommended) ?? scenarios.find(scenario => !scenario.isBaseline && scenario.animalsMoved > 0)
  const baseline = scenarios.find(scenario => scenario.isBaseline)
  const reason = text(records.proposal.narrative.recommendationReason).trim()
  const recipient = records.recipient.name
  if (!chosen || chosen.animalsMoved === 0) {
    const sentences = [`No scenario in this proposal moves animals into ${recipient}; the brief reports the expected course without action.`]
    if (baseline && Number.isFinite(baseline.atHorizon.inbreeding)) {
      sentences.push(`Without gene flow, inbreeding F is expected to reach ${formatFixed(baseline.atHorizon.inbreeding, 3)} in ${baseline.horizonYears} years, with expected fitness ${formatFitness(baseline.atHorizon.fitness)} of a non-inbred animal.`)
    }
    if (reason) sentences.push(reason)
    return sentences
  }
  const schedule = records.scenarios.find(record => record.id === chosen.id)?.inputs.schedule ?? null
  const from = chosen.sourceName ? ` from ${chosen.sourceName}` : ''
  const sentences = movesAnimals(schedule)
    ? [`Move ${animalsText(schedule)}${from} into ${recipient} ${cadenceText(schedule)} (scenario "${chosen.name}").`]
    : [`Follow scenario "${chosen.name}" for ${recipient}.`]
  if (baseline && Number.isFinite(chosen.atHorizon.inbreeding) && Number.isFinite(baseline.atHorizon.inbreeding)) {
    sentences.push(`Over ${chosen.horizonYears} years this is expected to keep inbreeding F at ${formatFixed(chosen.atHorizon.inbreeding, 3)} instead of ${formatFixed(baseline.atHorizon.inbreeding, 3)} without action, and expected fitness at ${formatFitness(chosen.atHorizon.fitness)} instead of ${formatFitness(baseline.atHorizon.fitness)} of a non-inbred animal (${formatChange(chosen.atHorizon.fitness, baseline.atHorizon.fitness)}).`)
  }
  sentences.push(`While releases continue this amounts to ${formatMigrants(chosen.migrantsPerGeneration)} effective migrants per generation (the rule of thumb asks for 1 to 10).`)
  const variant = chosen.establishment[0]
  if (variant) {
    sentences.push(`The chance that ${variant.variantName} establishes in ${recipient} is ${formatProbability(variant.overSchedule)} over all releases (${variant.method}); over the plausible s and h it ranges from ${formatProbability(variant.range.low)} to ${formatProbability(variant.range.high)}.`)
  }
  if (screen) {
    sentences.push(screen.level === 'low'
      ? 'The outbreeding-depression screen predicts a low risk.'
      : 'The outbreeding-depression screen predicts an elevated risk; see section 6 before acting.')
  }
  if (reason) sentences.push(`Why this scenario: ${reason}`)
  return sentences
}

/** Sentences that only make sense on screen (they point at interface elements). */
const SCREEN_ONLY = /\b(chip|click|popover|the band shows|under the figure)\b/i

/**
 * Workspace wording made fit for paper: sentences that point at interface elements are
 * dropped, and cross-references to other on-screen explanations are removed.
 *
 * @example printable('Shown from the exact chain. The chip under the figure says which.') // 'Shown from the exact chain.'
 */
export function printable(text: string): string {
  return text
    .replace(/\s*\(see "[^"]*"\)/g, '')
    .split(/(?<=[.!?])\s+/)
    .filter(sentence => !SCREEN_ONLY.test(sentence))
    .join(' ')
    .trim()
}

/**
 * A citation as printed: references to the team's internal science notes (SCIENCE.md) are
 * removed; an entry that cited only those notes becomes ''.
 *
 * @example publicSource('Kimura (1962), Genetics 47: 713–719 [SCIENCE.md §1.1]') // 'Kimura (1962), Genetics 47: 713–719'
 * @example publicSource('[SCIENCE.md §3.3]') // ''
 */
export function publicSource(text: string): string {
  const cleaned = text
    .replace(/\s*[[(][^\])]*SCIENCE\.md[^\])]*[\])]/g, '')
    .replace(/;?\s*SCIENCE\.md(\s*§[\d.]+(,\s*§[\d.]+)*)?[^;.]*[.;]?/g, '')
    .replace(/\s+/g, ' ')
    .trim()
  return /[A-Za-z]{3,}/.test(cleaned) ? cleaned : ''
}

function publicSources(sources: readonly string[]): string[] {
  return sources.map(publicSource).filter(source => source !== '')
}

function methodNotes(): BriefNote[] {
  return METHOD_IDS.map((id) => {
    const explanation = EXPLANATIONS[id]
    return {
      title: explanation.title,
      text: printable(explanation.method),
      ...(explanation.formula ? { formula: explanation.formula } : {}),
      assumptions: explanation.assumptions.map(printable).filter(text => text !== ''),
      sources: publicSources(explanation.citations),
    }
  })
}

function cautionNotes(computed: readonly ComputedScenario[]): BriefNote[] {
  const ids = new Set<CautionId>()
  for (const id of METHOD_IDS) for (const caution of EXPLANATIONS[id].cautions) ids.add(caution)
  for (const { results } of computed) {
    if (!results) continue
    for (const id of results.warnings) ids.add(id)
    for (const item of results.establishment) for (const id of item.warnings) ids.add(id)
  }
  return [...ids].map(id => ({ title: CAUTIONS[id].title, text: printable(CAUTIONS[id].text), sources: publicSources([CAUTIONS[id].source]) }))
}

function decisionOf(records: BriefRecords): BriefDecision {
  const decision = records.decision
  return {
    author: records.author,
    reviewer: records.reviewer,
    approver: decision?.decision === 'approve' ? decision.decidedBy : null,
    submittedAt: records.proposal.submittedAt,
    decidedAt: decision?.decidedAt ?? records.proposal.decidedAt,
    decision: decision?.decision ?? null,
    comment: decision?.comment ?? null,
  }
}

/**
 * Builds the brief's data from the records.
 *
 * @param records - the proposal and everything around it (see BriefRecords)
 * @returns the BriefData `buildBriefDocument` prints
 */
export function assembleBriefData(records: BriefRecords): BriefData {
  const recipientCentroid = records.recipient.centroid
  const recommendedId = records.proposal.recommendedScenarioId
  const ordered = [...records.scenarios].sort((a, b) => Number(b.isBaseline) - Number(a.isBaseline) || a.id - b.id)
  const computed = ordered.map(record => computeScenario(record, records, recommendedId))
  const scenarios = computed.map(item => item.scenario)
  const screen = screenOf(records)
  return {
    documentId: records.documentId,
    issuedAt: records.issuedAt,
    verifyUrl: records.verifyUrl,
    agency: records.agency,
    proposal: {
      id: records.proposal.id,
      title: records.proposal.title,
      status: records.proposal.status,
      reference: `${records.agency.shortName}-P-${records.proposal.id}`,
    },
    species: records.species,
    recipient: subpopulation(records.recipient, 'recipient', recipientCentroid),
    sources: records.sources.map(source => subpopulation(source, 'source', recipientCentroid)),
    others: records.others.map(other => subpopulation(other, 'other', recipientCentroid)),
    captiveSource: records.proposal.captiveSource,
    narrative: narrativeOf(records),
    recommendation: recommendationOf(records, scenarios, screen),
    scenarios,
    outbreeding: screen,
    methods: methodNotes(),
    cautions: cautionNotes(computed),
    decision: decisionOf(records),
  }
}

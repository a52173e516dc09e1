/**
 * The key figures of a scenario in reading order, each with its printed value, raw value and
 * explanation id: one list for the pinned cards of the workspace, the compare table and the
 * brief, so a figure reads the same everywhere.
 */
import type { ExplanationId } from './explanations'
import { formatNumber, formatProbability, formatYears } from './format'
import type { ScenarioInputsLike, ScenarioResults } from './types'

export interface KeyFigure {
  /** Stable key of the row (for tables that line scenarios up). */
  key: string
  label: string
  text: string
  /** The raw number behind the text (null when not applicable). */
  value: number | null
  explain: ExplanationId | null
}

function scheduleText(inputs: ScenarioInputsLike): string {
  const schedule = inputs.schedule
  if (!schedule || schedule.events < 1) return 'No animals moved'
  const every = schedule.events > 1 ? ` every ${schedule.intervalYears} years` : ''
  const first = schedule.firstEventYear ? `, from year ${schedule.firstEventYear}` : ''
  return `${schedule.animalsPerEvent} animals (${schedule.females} F, ${schedule.males} M) × ${schedule.events}${every}${first}`
}

/**
 * Key figures of one scenario.
 *
 * @param results - from computeScenarioResults
 * @param inputs - the scenario inputs the results came from
 * @param variantNames - establishment rows for these variant names (default: the scenario's own);
 *   a name the scenario lacks gets "—", so scenarios line up in a table
 * @returns the rows, in reading order
 * @example scenarioKeyFigures(results, inputs).map(row => `${row.key}=${row.text}`)
 *   // ['schedule=1 animals (1 F, 0 M) × 1', 'establishment:v=17.8% (exact chain)', 'time:v=278 years', 'inbreeding=0.049', …]
 */
export function scenarioKeyFigures(results: ScenarioResults, inputs: ScenarioInputsLike, variantNames?: readonly string[]): KeyFigure[] {
  const rows: KeyFigure[] = [
    { key: 'schedule', label: 'Schedule', text: scheduleText(inputs), value: null, explain: null },
  ]
  const names = variantNames ?? results.establishment.map(variant => variant.name)
  for (const name of names) {
    const variant = results.establishment.find(item => item.name === name)
    rows.push({
      key: `establishment:${name}`,
      label: `Establishes: ${name}`,
      text: variant ? `${formatProbability(variant.headline.probability)} (${variant.headline.method === 'exact' ? 'exact chain' : variant.headline.method === 'diffusion' ? 'diffusion' : 'no release'})` : '—',
      value: variant ? variant.headline.probability : null,
      explain: 'establishment.headline',
    })
    rows.push({
      key: `time:${name}`,
      label: `Time to establish: ${name}`,
      text: variant?.time ? formatYears(variant.time.fromFirstReleaseYears) : '—',
      value: variant?.time ? variant.time.fromFirstReleaseYears : null,
      explain: 'time.establishment',
    })
  }
  const at = results.projection.atHorizon
  const last = results.projection.years.length - 1
  const horizon = `${Math.round(at.years)} y`
  const withAction = results.hasRelease
  rows.push(
    { key: 'inbreeding', label: `F after ${horizon}`, text: (withAction ? at.inbreedingWith : at.inbreedingWithout).toFixed(3), value: withAction ? at.inbreedingWith : at.inbreedingWithout, explain: 'projection.inbreeding' },
    {
      key: 'heterozygosity',
      label: `H after ${horizon} (× today)`,
      text: (results.projection[withAction ? 'withAction' : 'withoutAction'].heterozygosity[last] ?? Number.NaN).toFixed(3),
      value: results.projection[withAction ? 'withAction' : 'withoutAction'].heterozygosity[last] ?? null,
      explain: 'projection.heterozygosity',
    },
    { key: 'fitness', label: `Fitness after ${horizon}`, text: (withAction ? at.fitnessWith : at.fitnessWithout).toFixed(3), value: withAction ? at.fitnessWith : at.fitnessWithout, explain: 'projection.fitness' },
    { key: 'fitnessRatio', label: 'Fitness vs no action', text: withAction ? `×${formatNumber(at.fitnessRatio, 3)}` : '×1', value: withAction ? at.fitnessRatio : 1, explain: 'projection.fitnessRatio' },
    {
      key: 'migrants',
      label: 'Effective migrants / generation',
      text: `${formatNumber(results.oneMigrantRule.value, 2)}${results.migrantsPerGeneration.oneOff ? ' (one-off)' : results.oneMigrantRule.meets ? ' (meets 1–10)' : results.hasRelease ? ' (below 1)' : ''}`,
      value: results.oneMigrantRule.value,
      explain: 'migrants.rule',
    },
    {
      key: 'outbreeding',
      label: 'Outbreeding risk',
      text: results.outbreeding ? (results.outbreeding.level === 'low' ? 'Low' : 'Elevated') : 'Not answered',
      value: null,
      explain: 'outbreeding.level',
    },
  )
  return rows
}

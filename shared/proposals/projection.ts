/**
 * Projected inbreeding F, heterozygosity H and relative fitness over the horizon, with the
 * scenario's releases and without any (the "No action" course).
 *
 * Model, one step per whole generation t = 1 … G (G = ⌊horizon / L⌋):
 *   - Releases in years [(t − 1)·L, t·L) add a_t unrelated animals to the N residents among the
 *     parents of generation t, so that generation's share of immigrant genes is
 *     m_t = a_t / (N + a_t) (they breed like residents — assumed, not known);
 *   - F_t = (1 − m_t)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(t−1)] — Wright's (1931) island-model step
 *     (SCIENCE.md eq. 4.2), one `inbreedingAfter` call per generation; with no release
 *     (m_t = 0) this is plain drift (eq. 4.1);
 *   - H_t relative to today = (1 − F_t)/(1 − F_0);
 *   - relative fitness W_t = exp(−B·F_t), B = 2B/2 (Morton, Crow & Muller 1956, eq. 6.1),
 *     also at both ends of the lethal-equivalent range.
 * The released animals' genes are taken as unrelated to the recipient (kinship 0 to the base):
 * a large source, not itself inbred relative to that base — the usual optimistic assumption.
 * Without action: `inbreedingTrajectory` at the same Ne from the same F_0.
 */
import {
  generationsFromYears,
  inbreedingAfter,
  inbreedingTrajectory,
  relativeFitness,
  rescueFitnessRatio,
  yearsFromGenerations,
} from '../genetics'
import type { LoadLike, ProjectionSeries, RecipientFigures, ReleaseStep, ScenarioProjection, ScheduleLike } from './types'
import { releaseYears } from './schedule'

function seriesFrom(inbreeding: number[], initialInbreeding: number, load: LoadLike): ProjectionSeries {
  const fitnessAt = (lethalEquivalents: number) => inbreeding.map(F => relativeFitness({ diploidLethalEquivalents: lethalEquivalents, inbreeding: F }))
  return {
    inbreeding,
    heterozygosity: inbreeding.map(F => (1 - F) / (1 - initialInbreeding)),
    fitness: fitnessAt(load.diploidLethalEquivalents),
    fitnessLow: fitnessAt(load.range[0]),
    fitnessHigh: fitnessAt(load.range[1]),
  }
}

/**
 * Which generation step each release enters: a release in year y joins the parents of
 * generation ⌊y / L⌋ + 1. Releases whose step lies past G are "after the horizon".
 *
 * @param schedule - the releases, or null
 * @param generationTimeYears - L, years per generation, > 0
 * @param wholeGenerations - G, the last generation projected
 * @returns the steps in time order and how many releases fall after the horizon
 * @example releaseSteps({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 1 }, 3, 10).steps.map(step => step.generation)
 *   // [1, 3, 4]
 */
export function releaseSteps(schedule: ScheduleLike | null, generationTimeYears: number, wholeGenerations: number): { steps: ReleaseStep[], afterHorizon: number } {
  const steps: ReleaseStep[] = []
  let afterHorizon = 0
  for (const year of releaseYears(schedule)) {
    const generation = Math.floor(year / generationTimeYears) + 1
    if (generation > wholeGenerations) {
      afterHorizon++
      continue
    }
    steps.push({ year, generation, animals: schedule?.animalsPerEvent ?? 0 })
  }
  return { steps, afterHorizon }
}

/**
 * F, H and fitness with and without the scenario's releases.
 *
 * @param recipient - N, Ne, L (years) and F₀ (see RecipientFigures)
 * @param schedule - the releases, or null for no action
 * @param load - diploid lethal equivalents and their range
 * @param horizonYears - horizon, years ≥ 1
 * @returns one point per whole generation from 0 to ⌊horizon / L⌋ (at least the starting point)
 * @throws RangeError if a figure is outside the engine's domain
 * @example projectScenario({ census: 18, effectiveSize: 20, generationTimeYears: 1, initialInbreeding: 0.25 },
 *   { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 5, events: 1 }, load, 3).withAction.inbreeding
 *   // [0.25, 0.21768749999999998, 0.23724531249999997, 0.25631417968750003] (SCIENCE.md §6.2: 0.2176875)
 * @example (same).withoutAction.inbreeding  // [0.25, 0.26875, 0.28703125, 0.30485546875]
 */
export function projectScenario(recipient: RecipientFigures, schedule: ScheduleLike | null, load: LoadLike, horizonYears: number): ScenarioProjection {
  const { census, effectiveSize, generationTimeYears, initialInbreeding } = recipient
  const wholeGenerations = Math.floor(generationsFromYears({ years: horizonYears, generationTime: generationTimeYears }) + 1e-9)
  const { steps, afterHorizon } = releaseSteps(schedule, generationTimeYears, wholeGenerations)
  const animalsByGeneration = new Float64Array(wholeGenerations + 1)
  for (const step of steps) animalsByGeneration[step.generation] = (animalsByGeneration[step.generation] ?? 0) + step.animals

  const without = inbreedingTrajectory({ effectiveSize, generations: wholeGenerations, initialInbreeding })
  // Between releases F follows Wright's closed form from the last release (so before the
  // first release, and for no action, it is the without-action course to the last digit).
  const withAction = [initialInbreeding]
  let anchorGeneration = 0
  let anchorInbreeding = initialInbreeding
  for (let generation = 1; generation <= wholeGenerations; generation++) {
    const animals = animalsByGeneration[generation] ?? 0
    if (animals > 0) {
      const previous = withAction[generation - 1] ?? initialInbreeding
      anchorInbreeding = inbreedingAfter({ effectiveSize, generations: 1, initialInbreeding: previous, migrationRate: animals / (census + animals) })
      anchorGeneration = generation
      withAction.push(anchorInbreeding)
    } else {
      withAction.push(inbreedingAfter({ effectiveSize, generations: generation - anchorGeneration, initialInbreeding: anchorInbreeding }))
    }
  }

  const generations = Array.from({ length: wholeGenerations + 1 }, (_, index) => index)
  const years = generations.map(generation => yearsFromGenerations({ generations: generation, generationTime: generationTimeYears }))
  const last = wholeGenerations
  const inbreedingWith = withAction[last] ?? initialInbreeding
  const inbreedingWithout = without[last] ?? initialInbreeding
  const withSeries = seriesFrom(withAction, initialInbreeding, load)
  const withoutSeries = seriesFrom(without, initialInbreeding, load)
  return {
    generations,
    years,
    withAction: withSeries,
    withoutAction: withoutSeries,
    releases: steps,
    releasesAfterHorizon: afterHorizon,
    atHorizon: {
      years: years[last] ?? 0,
      inbreedingWith,
      inbreedingWithout,
      fitnessWith: withSeries.fitness[last] ?? 1,
      fitnessWithout: withoutSeries.fitness[last] ?? 1,
      fitnessRatio: rescueFitnessRatio({
        diploidLethalEquivalents: load.diploidLethalEquivalents,
        recipientInbreeding: inbreedingWithout,
        offspringInbreeding: inbreedingWith,
      }),
    },
  }
}

import { logAddExp } from './log-space'

/**
 * Adaptive Gauss–Kronrod (7/15-point) quadrature carried out in log space
 * (internal; used for the outer integral of the conditional fixation time).
 *
 * Why: the integrand of Kimura & Ohta's formula is a ratio of integrals that
 * can individually be as large as e^(10⁶) or as small as e^(−10⁶); passing its
 * logarithm keeps every panel in range. Each panel is scaled by its own
 * largest value, and the panel with the largest error estimate |K15 − G7| is
 * bisected until the summed estimate is below `relativeTolerance` of the total.
 * Reference: Piessens et al. (1983), QUADPACK (the 7/15 Gauss–Kronrod pair).
 */

/**
 * Kronrod nodes on the [0, 1] half of [−1, 1] (the rule is symmetric; the last
 * is the centre), QUADPACK's 33-digit values rounded to the nearest double.
 */
const KRONROD_NODES = [
  0.9914553711208126, 0.9491079123427585,
  0.8648644233597691, 0.7415311855993945,
  0.5860872354676911, 0.4058451513773972,
  0.20778495500789848, 0,
]
const KRONROD_WEIGHTS = [
  0.022935322010529224, 0.06309209262997856,
  0.10479001032225019, 0.14065325971552592,
  0.1690047266392679, 0.19035057806478542,
  0.20443294007529889, 0.20948214108472782,
]
/** Gauss weights for the Kronrod nodes with odd index: 1, 3, 5 and 7 (the centre). */
const GAUSS_WEIGHTS = [
  0.1294849661688697, 0.27970539148927664,
  0.3818300505051189, 0.4179591836734694,
]

interface Panel {
  lower: number
  upper: number
  logValue: number
  logError: number
}

function evaluatePanel(logIntegrand: (x: number) => number, lower: number, upper: number): Panel {
  const halfWidth = 0.5 * (upper - lower)
  const centre = lower + halfWidth
  const logValues = new Float64Array(15)
  let largest = -Infinity
  for (let index = 0; index < 15; index++) {
    const node = index < 8 ? (KRONROD_NODES[index] ?? 0) : -(KRONROD_NODES[14 - index] ?? 0)
    const value = logIntegrand(centre + halfWidth * node)
    logValues[index] = value
    if (value > largest) largest = value
  }
  if (largest === -Infinity) return { lower, upper, logValue: -Infinity, logError: -Infinity }
  let kronrod = 0
  let gauss = 0
  for (let index = 0; index < 15; index++) {
    const mirrored = index < 8 ? index : 14 - index
    const scaled = Math.exp((logValues[index] ?? -Infinity) - largest)
    kronrod += (KRONROD_WEIGHTS[mirrored] ?? 0) * scaled
    // The 7 Gauss nodes are the Kronrod nodes with odd index (1, 3, 5 and the centre, 7).
    if (mirrored % 2 === 1) gauss += (GAUSS_WEIGHTS[(mirrored - 1) / 2] ?? 0) * scaled
  }
  const logScale = largest + Math.log(halfWidth)
  return {
    lower,
    upper,
    logValue: logScale + Math.log(kronrod),
    logError: logScale + Math.log(Math.abs(kronrod - gauss)),
  }
}

/**
 * log ∫ exp(logIntegrand(x)) dx over [breakpoints[0], breakpoints[last]].
 *
 * @param logIntegrand - log of a non-negative integrand (−Infinity where it is 0)
 * @param breakpoints - increasing points that start the subdivision (≥ 2)
 * @param relativeTolerance - target for the summed |K15 − G7| estimates, > 0
 * @param maximumPanels - stop refining after this many panels
 * @returns log of the integral (−Infinity if the integrand is 0 everywhere sampled)
 * @example logIntegralAdaptive(x => Math.log(x), [0, 1], 1e-12, 500)  // log ½ = −0.6931471805599453
 */
export function logIntegralAdaptive(
  logIntegrand: (x: number) => number,
  breakpoints: readonly number[],
  relativeTolerance: number,
  maximumPanels: number,
): number {
  const panels: Panel[] = []
  for (let index = 1; index < breakpoints.length; index++) {
    const lower = breakpoints[index - 1] ?? 0
    const upper = breakpoints[index] ?? 0
    if (upper > lower) panels.push(evaluatePanel(logIntegrand, lower, upper))
  }
  const logTolerance = Math.log(relativeTolerance)
  while (panels.length < maximumPanels) {
    let logTotal = -Infinity
    let logErrorTotal = -Infinity
    let worst = -1
    for (let index = 0; index < panels.length; index++) {
      const panel = panels[index]
      if (panel === undefined) continue
      logTotal = logAddExp(logTotal, panel.logValue)
      logErrorTotal = logAddExp(logErrorTotal, panel.logError)
      if (worst < 0 || panel.logError > (panels[worst]?.logError ?? -Infinity)) worst = index
    }
    const target = panels[worst]
    if (target === undefined || logTotal === -Infinity || logErrorTotal - logTotal <= logTolerance) break
    const middle = 0.5 * (target.lower + target.upper)
    if (!(middle > target.lower && middle < target.upper)) break
    panels.splice(worst, 1, evaluatePanel(logIntegrand, target.lower, middle), evaluatePanel(logIntegrand, middle, target.upper))
  }
  let logTotal = -Infinity
  for (const panel of panels) logTotal = logAddExp(logTotal, panel.logValue)
  return logTotal
}

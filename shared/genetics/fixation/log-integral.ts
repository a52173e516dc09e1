import { gaussLegendreRule } from './gauss-legendre'
import { logAddExp } from './log-space'
import { panelOrder } from './panel-order'

/**
 * Natural log of ∫ exp(−(linear·x + quadratic·x²)) dx over [lower, upper]
 * (internal; the numerical core of the fixation probability and time).
 *
 * Why in logs: with |2·Ne·s| up to 10⁶ the integrand spans e^(±10⁶), far
 * outside double range (SCIENCE.md §1.5 pitfall 1); every result is carried
 * as a logarithm and only the final probability is exponentiated.
 *
 * Method (SCIENCE.md §1.5, recommended algorithm): split the interval at the
 * stationary point x* = −linear/(2·quadratic) so that each piece is monotone;
 * integrate each piece from its larger end, where the integrand is scaled to
 * 1, outwards in Gauss–Legendre panels whose ends are placed where the
 * exponent has fallen by 8, 20, 36, 52, … (a geometric-like refinement around
 * the peak at the natural scale 1/|φ′| or 1/√|quadratic|). Each panel gets the
 * fewest points that keep its share of the error below 2×10⁻¹⁵ of the running
 * total (`panelOrder`), and integration stops once the rest of the piece is
 * provably below 10⁻¹⁷ of the total. When quadratic = 0 (h = ½) each piece is
 * the closed form (1 − e^(−slope·L))/slope, evaluated with expm1.
 * Exponent differences are formed as d·(slope + quadratic·d) from the piece's
 * start, never as differences of large exponents, so they keep full relative
 * precision. No division by s occurs, so near-neutral inputs are safe.
 *
 * @param linear - coefficient of x in the exponent, finite
 * @param quadratic - coefficient of x², finite
 * @param lower - lower limit
 * @param upper - upper limit
 * @returns log of the integral; −Infinity when upper ≤ lower
 * @example logIntegralOfExponentialQuadratic(0, 0, 0, 0.25)   // −1.3862943611198906 (= log ¼)
 * @example logIntegralOfExponentialQuadratic(2, 0, 0, 1)      // log((1 − e⁻²)/2) = −0.8385606384288044
 */
export function logIntegralOfExponentialQuadratic(linear: number, quadratic: number, lower: number, upper: number): number {
  if (!(upper > lower)) return -Infinity
  if (quadratic !== 0) {
    const stationaryPoint = -linear / (2 * quadratic)
    if (stationaryPoint > lower && stationaryPoint < upper) {
      return logAddExp(
        logMonotonePiece(linear, quadratic, lower, stationaryPoint),
        logMonotonePiece(linear, quadratic, stationaryPoint, upper),
      )
    }
  }
  return logMonotonePiece(linear, quadratic, lower, upper)
}

/** Target relative error of one panel's contribution to the running total. */
const PANEL_TOLERANCE = 2e-15
/** Integration of a piece stops once the remainder is below this fraction of the total. */
const TAIL_FRACTION = 1e-17
/** Exponent drops (from the piece's peak) at which panels end: 8, 20, 36, then every 16. */
const FIRST_LEVELS = [8, 20, 36] as const
const LEVEL_STEP = 16

/** Exponent drop at the end of panel `index`. */
function panelLevel(index: number): number {
  return FIRST_LEVELS[index] ?? 36 + LEVEL_STEP * (index - 2)
}

/**
 * Distance d ≥ 0 from the peak at which the exponent has fallen by `drop`:
 * the smallest root of quadratic·d² + slope·d = drop (Infinity if never).
 * The form 2·drop/(slope + √(slope² + 4·quadratic·drop)) avoids cancellation.
 */
function distanceAtDrop(slope: number, quadratic: number, drop: number): number {
  if (quadratic === 0) return drop / slope
  const discriminant = slope * slope + 4 * quadratic * drop
  if (discriminant < 0) return Infinity
  return (2 * drop) / (slope + Math.sqrt(discriminant))
}

/**
 * log ∫ over a piece on which the exponent is monotone. The piece is walked
 * from its larger end `start` in direction ±1; with d the distance walked,
 * φ(start ± d) = φ(start) − (slope·d + quadratic·d²), slope ≥ 0.
 */
function logMonotonePiece(linear: number, quadratic: number, lower: number, upper: number): number {
  const length = upper - lower
  const middle = 0.5 * (lower + upper)
  // φ′(middle) = −(linear + 2·quadratic·middle); φ decreasing → peak at `lower`.
  const fromLower = linear + 2 * quadratic * middle >= 0
  const start = fromLower ? lower : upper
  const direction = fromLower ? 1 : -1
  // Clamped: at a stationary point the slope is 0 up to rounding.
  const slope = Math.max(0, direction * (linear + 2 * quadratic * start))
  const logPeak = -start * (linear + quadratic * start)
  const totalDrop = length * (slope + quadratic * length)
  if (!(totalDrop > 0)) return logPeak + Math.log(length)
  if (quadratic === 0) {
    // Closed form for a linear exponent: ∫₀ᴸ e^(−slope·d) dd = L·(1 − e^(−x))/x with
    // x = slope·L, the ratio written so that tiny (even subnormal) x stays exact.
    const ratio = totalDrop < 1e-8 ? 1 - totalDrop / 2 : -Math.expm1(-totalDrop) / totalDrop
    return logPeak + Math.log(length) + Math.log(ratio)
  }
  let sum = 0
  let panelStart = 0
  let dropAtStart = 0
  for (let index = 0; ; index++) {
    const level = panelLevel(index)
    let panelEnd = level >= totalDrop ? length : distanceAtDrop(slope, quadratic, level)
    let dropAtEnd = level
    if (!(panelEnd < length)) {
      panelEnd = length
      dropAtEnd = totalDrop
    }
    const width = panelEnd - panelStart
    const bound = Math.exp(-dropAtStart) * width
    const order = panelOrder(dropAtEnd - dropAtStart, PANEL_TOLERANCE * Math.max(1, sum / bound))
    const { nodes, weights } = gaussLegendreRule(order)
    const halfWidth = 0.5 * width
    const centre = panelStart + halfWidth
    let panel = 0
    for (let node = 0; node < order; node++) {
      const distance = centre + halfWidth * (nodes[node] ?? 0)
      panel += (weights[node] ?? 0) * Math.exp(-distance * (slope + quadratic * distance))
    }
    sum += panel * halfWidth
    if (panelEnd >= length) break
    // Bound on what is left: e^(−drop)·(remaining length), or for a steepening
    // exponent (quadratic > 0) e^(−drop)/current slope.
    const remaining = length - panelEnd
    const currentSlope = slope + 2 * quadratic * panelEnd
    const reach = quadratic > 0 ? Math.min(remaining, 1 / currentSlope) : remaining
    if (Math.exp(-dropAtEnd) * reach <= TAIL_FRACTION * sum) break
    panelStart = panelEnd
    dropAtStart = dropAtEnd
  }
  return logPeak + Math.log(sum)
}

/**
 * Gauss–Legendre quadrature rules on [−1, 1], computed once per order and
 * cached (internal to the fixation module, not re-exported).
 *
 * Why: the fixation integrals are sums of short panels, each integrated with
 * an n-point Gauss–Legendre rule; n-point rules integrate polynomials of
 * degree 2n − 1 exactly and converge geometrically for the entire functions
 * exp(quadratic) met here.
 *
 * Method: the nodes are the roots of the Legendre polynomial Pₙ, found by
 * Newton's method from the asymptotic guess cos(π(i + ¾)/(n + ½)); the
 * weights are 2 / ((1 − x²)·Pₙ′(x)²). In double precision the nodes and
 * weights come out within a few ulps, which the tests confirm by integrating
 * polynomials exactly.
 * Reference: Golub & Welsch (1969), Math. Comp. 23: 221–230 (the rules);
 *   the Newton recurrence is the textbook three-term Legendre recurrence.
 */
export interface GaussLegendreRule {
  /** Nodes in (−1, 1), ordered from +1 down to −1. */
  readonly nodes: Float64Array
  /** Matching weights; they sum to 2. */
  readonly weights: Float64Array
}

/** Rules by order (an array: the lookup sits in the innermost quadrature loop). */
const cache: (GaussLegendreRule | undefined)[] = []

/** Pₙ(x) and Pₙ₋₁(x) by the three-term recurrence. */
function legendrePair(order: number, x: number): [number, number] {
  let current = 1
  let previous = 0
  for (let degree = 1; degree <= order; degree++) {
    const beforePrevious = previous
    previous = current
    current = ((2 * degree - 1) * x * previous - (degree - 1) * beforePrevious) / degree
  }
  return [current, previous]
}

function buildRule(order: number): GaussLegendreRule {
  const nodes = new Float64Array(order)
  const weights = new Float64Array(order)
  for (let index = 0; index < order; index++) {
    let x = Math.cos((Math.PI * (index + 0.75)) / (order + 0.5))
    for (let iteration = 0; iteration < 100; iteration++) {
      const [value, previous] = legendrePair(order, x)
      const derivative = (order * (x * value - previous)) / (x * x - 1)
      const step = value / derivative
      x -= step
      if (Math.abs(step) <= 1e-17) break
    }
    const [value, previous] = legendrePair(order, x)
    const derivative = (order * (x * value - previous)) / (x * x - 1)
    nodes[index] = x
    weights[index] = 2 / ((1 - x * x) * derivative * derivative)
  }
  return { nodes, weights }
}

/**
 * The n-point Gauss–Legendre rule on [−1, 1], built on first use.
 *
 * @param order - n, integer ≥ 1 (orders up to about 60 keep full accuracy)
 * @returns nodes and weights as typed arrays (shared; do not modify)
 * @example gaussLegendreRule(2).nodes  // Float64Array [0.5773502691896257, −0.5773502691896257]
 */
export function gaussLegendreRule(order: number): GaussLegendreRule {
  let rule = cache[order]
  if (rule === undefined) {
    rule = buildRule(order)
    cache[order] = rule
  }
  return rule
}

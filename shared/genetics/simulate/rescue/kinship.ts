/**
 * Pedigree kinship among offspring from the kinship of their parents.
 *
 * Recurrence (Malécot 1948; e.g. Lynch & Walsh 1998 ch. 7 [memory]): for
 * distinct offspring x, y with parents (m_x, f_x), (m_y, f_y),
 * f(x, y) = ¼·[f(m_x, m_y) + f(m_x, f_y) + f(f_x, m_y) + f(f_x, f_y)];
 * self-kinship f(x, x) = ½·(1 + F_x) with inbreeding F_x = f(m_x, f_x).
 *
 * Parents are numbered 0…P−1 for residents, whose kinship is `parentKinship`,
 * and P, P+1, … for immigrants from the source, which are treated as
 * founders: unrelated to everyone and non-inbred (self-kinship ½), the
 * studbook convention for wild-caught animals and the assumption of the
 * island-model recurrence (SCIENCE.md §4.2).
 *
 * The upper triangle is computed row by row (four reads from the two parents'
 * rows, which stay in cache) and each value is also written to its mirror
 * place down the column (consecutive rows fill the same cache lines):
 * O(N²/2) arithmetic, one pass over the matrix (a separate mirroring pass
 * afterwards was about 20 % slower). Stored in single precision (relative
 * rounding ~6·10⁻⁸ per generation): the matrix is the largest array of the
 * model and its memory traffic sets the cost.
 *
 * @param parentKinship - P × P kinship of resident parents (row-major)
 * @param parentCount - P
 * @param mothers - parent number of each offspring's mother
 * @param fathers - parent number of each offspring's father
 * @param reuse - optional buffer for the result (used if it holds ≥ N² entries
 *   and is not `parentKinship`)
 * @returns the N × N kinship of the offspring (a view of `reuse` when it was used)
 * @example offspringKinship(Float32Array.of(0.5, 0, 0, 0.5), 2, Int32Array.of(0, 0), Int32Array.of(1, 1))
 *   // Float32Array [0.5, 0.25, 0.25, 0.5] (full sibs of unrelated founders)
 */
export function offspringKinship(parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array, reuse?: Float32Array): Float32Array {
  const size = mothers.length
  const kinship = reuse && reuse.length >= size * size && reuse.buffer !== parentKinship.buffer
    ? reuse.subarray(0, size * size)
    : new Float32Array(size * size)
  let immigrantParents = false
  for (let y = 0; y < size; y++) {
    if ((mothers[y] as number) >= parentCount || (fathers[y] as number) >= parentCount) immigrantParents = true
  }
  // Hot loops: parent numbers index the parents' matrix (or are immigrants,
  // handled by `kinshipOf`) and all other indices are in range by
  // construction, hence the `as number` reads.
  for (let x = 0; x < size; x++) {
    const mother = mothers[x] as number
    const father = fathers[x] as number
    const out = x * size
    if (!immigrantParents) {
      const motherRow = mother * parentCount
      const fatherRow = father * parentCount
      for (let y = x + 1, mirror = (x + 1) * size + x; y < size; y++, mirror += size) {
        const otherMother = mothers[y] as number
        const otherFather = fathers[y] as number
        const value = 0.25 * ((parentKinship[motherRow + otherMother] as number) + (parentKinship[motherRow + otherFather] as number)
          + (parentKinship[fatherRow + otherMother] as number) + (parentKinship[fatherRow + otherFather] as number))
        kinship[out + y] = value
        kinship[mirror] = value
      }
    } else {
      for (let y = x + 1, mirror = (x + 1) * size + x; y < size; y++, mirror += size) {
        const otherMother = mothers[y] as number
        const otherFather = fathers[y] as number
        const value = 0.25 * (kinshipOf(parentKinship, parentCount, mother, otherMother) + kinshipOf(parentKinship, parentCount, mother, otherFather)
          + kinshipOf(parentKinship, parentCount, father, otherMother) + kinshipOf(parentKinship, parentCount, father, otherFather))
        kinship[out + y] = value
        kinship[mirror] = value
      }
    }
    kinship[out + x] = 0.5 * (1 + kinshipOf(parentKinship, parentCount, mother, father))
  }
  return kinship
}

/** Kinship of two parents by number: residents from the matrix; an immigrant is ½ with itself and 0 with anyone else. */
function kinshipOf(parentKinship: Float32Array, parentCount: number, a: number, b: number): number {
  if (a < parentCount && b < parentCount) return parentKinship[a * parentCount + b] as number
  return a === b ? 0.5 : 0
}

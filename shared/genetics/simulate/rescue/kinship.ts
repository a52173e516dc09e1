/**
 * Pedigree kinship among offspring from the kinship of their parents.
 *
 * Recurrence (Malécot 1948; e.g. Lynch & Walsh 1998 ch. 7 [memory]): for
 * distinct offspring x, y with parents (m_x, f_x), (m_y, f_y),
 * f(x, y) = ¼·[f(m_x, m_y) + f(m_x, f_y) + f(f_x, m_y) + f(f_x, f_y)];
 * self-kinship f(x, x) = ½·(1 + F_x) with inbreeding F_x = f(m_x, f_x).
 *
 * Parents are numbered 0…P−1 for residents, whose kinship is `parentKinship`,
 * and P, P+1, … for founders — immigrants from the source, translocated
 * animals and the phase's first generation (see `Pedigree`) — unrelated to
 * everyone and non-inbred (self-kinship ½), the studbook convention for
 * wild-caught animals and the assumption of the island-model recurrence
 * (SCIENCE.md §4.2).
 *
 * The upper triangle is computed four rows at a time: for each later
 * offspring y its parents' numbers are read once and serve the four rows,
 * and the four values go to their row places and, side by side, to their
 * mirror places down the columns (one cache line). Without immigrant
 * parents every read is a plain matrix read; with them each goes through
 * `kinshipOf`. O(N²/2) arithmetic, one pass over the matrix; each value is
 * computed by the same operations in the same order as one row at a time
 * (1.2–1.9× faster than that in paired runs, N = 500; a separate mirroring
 * pass was slower still). Stored in single precision (relative rounding
 * ~6·10⁻⁸ per generation): the matrix is the largest array of the model and
 * its memory traffic sets the cost.
 *
 * @param parentKinship - P × P kinship of resident parents (row-major)
 * @param parentCount - P
 * @param mothers - parent number of each offspring's mother
 * @param fathers - parent number of each offspring's father
 * @returns the N × N kinship of the offspring (a new array)
 * @example offspringKinship(Float32Array.of(0.5, 0, 0, 0.5), 2, Int32Array.of(0, 0), Int32Array.of(1, 1))
 *   // Float32Array [0.5, 0.25, 0.25, 0.5] (full sibs of unrelated founders)
 */
export function offspringKinship(parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array): Float32Array {
  const size = mothers.length
  const kinship = new Float32Array(size * size)
  let immigrantParents = false
  for (let y = 0; y < size; y++) {
    if ((mothers[y] as number) >= parentCount || (fathers[y] as number) >= parentCount) immigrantParents = true
  }
  if (immigrantParents) {
    for (let x = 0; x < size; x++) writeRowWithImmigrants(kinship, parentKinship, parentCount, mothers, fathers, x)
    return kinship
  }
  // Hot loops: parent numbers index the parents' matrix and all other
  // indices are in range by construction, hence the `as number` reads.
  let x = 0
  for (; x + 3 < size; x += 4) {
    const mother0 = (mothers[x] as number) * parentCount
    const father0 = (fathers[x] as number) * parentCount
    const mother1 = (mothers[x + 1] as number) * parentCount
    const father1 = (fathers[x + 1] as number) * parentCount
    const mother2 = (mothers[x + 2] as number) * parentCount
    const father2 = (fathers[x + 2] as number) * parentCount
    const mother3 = (mothers[x + 3] as number) * parentCount
    const father3 = (fathers[x + 3] as number) * parentCount
    // The 4 × 4 block on the diagonal, then the four rows together.
    for (let row = x; row < x + 4; row++) writeRow(kinship, parentKinship, parentCount, mothers, fathers, row, x + 4)
    const out0 = x * size
    const out1 = out0 + size
    const out2 = out1 + size
    const out3 = out2 + size
    for (let y = x + 4, mirror = (x + 4) * size + x; y < size; y++, mirror += size) {
      const otherMother = mothers[y] as number
      const otherFather = fathers[y] as number
      const value0 = 0.25 * ((parentKinship[mother0 + otherMother] as number) + (parentKinship[mother0 + otherFather] as number)
        + (parentKinship[father0 + otherMother] as number) + (parentKinship[father0 + otherFather] as number))
      const value1 = 0.25 * ((parentKinship[mother1 + otherMother] as number) + (parentKinship[mother1 + otherFather] as number)
        + (parentKinship[father1 + otherMother] as number) + (parentKinship[father1 + otherFather] as number))
      const value2 = 0.25 * ((parentKinship[mother2 + otherMother] as number) + (parentKinship[mother2 + otherFather] as number)
        + (parentKinship[father2 + otherMother] as number) + (parentKinship[father2 + otherFather] as number))
      const value3 = 0.25 * ((parentKinship[mother3 + otherMother] as number) + (parentKinship[mother3 + otherFather] as number)
        + (parentKinship[father3 + otherMother] as number) + (parentKinship[father3 + otherFather] as number))
      kinship[out0 + y] = value0
      kinship[out1 + y] = value1
      kinship[out2 + y] = value2
      kinship[out3 + y] = value3
      kinship[mirror] = value0
      kinship[mirror + 1] = value1
      kinship[mirror + 2] = value2
      kinship[mirror + 3] = value3
    }
  }
  for (; x < size; x++) writeRow(kinship, parentKinship, parentCount, mothers, fathers, x, size)
  return kinship
}

/**
 * Offspring x's self-kinship and its kinship with offspring x + 1 … end − 1
 * (written to both places), all parents residents.
 */
function writeRow(kinship: Float32Array, parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array, x: number, end: number): void {
  const size = mothers.length
  const motherRow = (mothers[x] as number) * parentCount
  const fatherRow = (fathers[x] as number) * parentCount
  for (let y = x + 1; y < end; y++) {
    const otherMother = mothers[y] as number
    const otherFather = fathers[y] as number
    const value = 0.25 * ((parentKinship[motherRow + otherMother] as number) + (parentKinship[motherRow + otherFather] as number)
      + (parentKinship[fatherRow + otherMother] as number) + (parentKinship[fatherRow + otherFather] as number))
    kinship[x * size + y] = value
    kinship[y * size + x] = value
  }
  kinship[x * size + x] = 0.5 * (1 + (parentKinship[motherRow + (fathers[x] as number)] as number))
}

/** `writeRow` to the end of the matrix when some parents are immigrants (numbers ≥ parentCount). */
function writeRowWithImmigrants(kinship: Float32Array, parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array, x: number): void {
  const size = mothers.length
  const mother = mothers[x] as number
  const father = fathers[x] as number
  for (let y = x + 1; y < size; y++) {
    const otherMother = mothers[y] as number
    const otherFather = fathers[y] as number
    const value = 0.25 * (kinshipOf(parentKinship, parentCount, mother, otherMother) + kinshipOf(parentKinship, parentCount, mother, otherFather)
      + kinshipOf(parentKinship, parentCount, father, otherMother) + kinshipOf(parentKinship, parentCount, father, otherFather))
    kinship[x * size + y] = value
    kinship[y * size + x] = value
  }
  kinship[x * size + x] = 0.5 * (1 + kinshipOf(parentKinship, parentCount, mother, father))
}

/**
 * Kinship of two parents by number: residents (numbers < parentCount) from
 * the matrix; an immigrant or founder is ½ with itself and 0 with anyone else.
 *
 * @param parentKinship - P × P kinship of resident parents
 * @param parentCount - P
 * @param a - a parent number
 * @param b - another (or the same) parent number
 * @returns f(a, b)
 */
export function kinshipOf(parentKinship: Float32Array, parentCount: number, a: number, b: number): number {
  if (a < parentCount && b < parentCount) return parentKinship[a * parentCount + b] as number
  return a === b ? 0.5 : 0
}

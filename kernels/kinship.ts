// AssemblyScript source of the kinship kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/kinship-wasm.ts; see that folder's kinship-kernel.ts).
//
// Pedigree kinship of a generation from its parents' (shared/genetics/simulate/rescue/kinship.ts,
// `offspringKinship`): f(x, y) = ¼[f(mx, my) + f(mx, fy) + f(fx, my) + f(fx, fy)] and
// f(x, x) = ½[1 + f(mx, fx)], parents numbered ≥ parentCount being founders (kinship ½ with
// themselves, 0 with anyone else). The parents' matrix is float32; each value is summed in double
// precision in that order and rounded to float32 once, as the TypeScript does, so every entry is
// the same bit for bit (tests/unit/genetics/rescue-kernels.test.ts).

/** f(a, b) between two parents (byte address of the parents' matrix, parentCount × parentCount). */
// @ts-ignore: decorator
@inline function parentKinship(parents: usize, parentCount: i32, a: i32, b: i32): f64 {
  if (a < parentCount && b < parentCount) return <f64>load<f32>(parents + ((<usize>a * <usize>parentCount + <usize>b) << 2))
  return a == b ? 0.5 : 0
}

/**
 * Writes the size × size kinship of a generation to `out` from its mothers and fathers (int32
 * parent numbers at `mothers`, `fathers`) and the parents' matrix at `parents`: four rows at a
 * time (the mirrored entries of a column then share a cache line) when every parent has a row
 * in the parents' matrix, row by row with the founder rule otherwise.
 */
export function offspringKinship(parents: usize, parentCount: i32, mothers: usize, fathers: usize, size: i32, out: usize): void {
  for (let x = 0; x < size; x++) {
    if (load<i32>(mothers + (<usize>x << 2)) >= parentCount || load<i32>(fathers + (<usize>x << 2)) >= parentCount) {
      for (let row = 0; row < size; row++) writeRow(parents, parentCount, mothers, fathers, size, out, row, size)
      return
    }
  }
  blockedKinship(parents, parentCount, mothers, fathers, size, out)
}

/** `offspringKinship` when no parent is a founder. */
function blockedKinship(parents: usize, parentCount: i32, mothers: usize, fathers: usize, size: i32, out: usize): void {
  const rowBytes = <usize>size << 2
  const parentRowBytes = <usize>parentCount << 2
  let x: i32 = 0
  for (; x + 3 < size; x += 4) {
    for (let row = x; row < x + 4; row++) writeRow(parents, parentCount, mothers, fathers, size, out, row, x + 4)
    // Rows of the four members' mothers and fathers in the parents' matrix.
    const mother0 = parents + <usize>load<i32>(mothers + (<usize>x << 2)) * parentRowBytes
    const father0 = parents + <usize>load<i32>(fathers + (<usize>x << 2)) * parentRowBytes
    const mother1 = parents + <usize>load<i32>(mothers + (<usize>(x + 1) << 2)) * parentRowBytes
    const father1 = parents + <usize>load<i32>(fathers + (<usize>(x + 1) << 2)) * parentRowBytes
    const mother2 = parents + <usize>load<i32>(mothers + (<usize>(x + 2) << 2)) * parentRowBytes
    const father2 = parents + <usize>load<i32>(fathers + (<usize>(x + 2) << 2)) * parentRowBytes
    const mother3 = parents + <usize>load<i32>(mothers + (<usize>(x + 3) << 2)) * parentRowBytes
    const father3 = parents + <usize>load<i32>(fathers + (<usize>(x + 3) << 2)) * parentRowBytes
    const out0 = out + <usize>x * rowBytes
    let mirror = out + <usize>(x + 4) * rowBytes + (<usize>x << 2)
    for (let y = x + 4; y < size; y++, mirror += rowBytes) {
      const otherMother = <usize>load<i32>(mothers + (<usize>y << 2)) << 2
      const otherFather = <usize>load<i32>(fathers + (<usize>y << 2)) << 2
      const value0 = <f32>(0.25 * (<f64>load<f32>(mother0 + otherMother) + <f64>load<f32>(mother0 + otherFather)
        + <f64>load<f32>(father0 + otherMother) + <f64>load<f32>(father0 + otherFather)))
      const value1 = <f32>(0.25 * (<f64>load<f32>(mother1 + otherMother) + <f64>load<f32>(mother1 + otherFather)
        + <f64>load<f32>(father1 + otherMother) + <f64>load<f32>(father1 + otherFather)))
      const value2 = <f32>(0.25 * (<f64>load<f32>(mother2 + otherMother) + <f64>load<f32>(mother2 + otherFather)
        + <f64>load<f32>(father2 + otherMother) + <f64>load<f32>(father2 + otherFather)))
      const value3 = <f32>(0.25 * (<f64>load<f32>(mother3 + otherMother) + <f64>load<f32>(mother3 + otherFather)
        + <f64>load<f32>(father3 + otherMother) + <f64>load<f32>(father3 + otherFather)))
      const column = <usize>y << 2
      store<f32>(out0 + column, value0)
      store<f32>(out0 + rowBytes + column, value1)
      store<f32>(out0 + 2 * rowBytes + column, value2)
      store<f32>(out0 + 3 * rowBytes + column, value3)
      store<f32>(mirror, value0)
      store<f32>(mirror + 4, value1)
      store<f32>(mirror + 8, value2)
      store<f32>(mirror + 12, value3)
    }
  }
  for (; x < size; x++) writeRow(parents, parentCount, mothers, fathers, size, out, x, size)
}

/** Row x from column x + 1 to end − 1 (and the mirrored column), then the diagonal entry. */
function writeRow(parents: usize, parentCount: i32, mothers: usize, fathers: usize, size: i32, out: usize, x: i32, end: i32): void {
  const mother = load<i32>(mothers + (<usize>x << 2))
  const father = load<i32>(fathers + (<usize>x << 2))
  for (let y = x + 1; y < end; y++) {
    const otherMother = load<i32>(mothers + (<usize>y << 2))
    const otherFather = load<i32>(fathers + (<usize>y << 2))
    const value = <f32>(0.25 * (parentKinship(parents, parentCount, mother, otherMother) + parentKinship(parents, parentCount, mother, otherFather)
      + parentKinship(parents, parentCount, father, otherMother) + parentKinship(parents, parentCount, father, otherFather)))
    store<f32>(out + ((<usize>x * <usize>size + <usize>y) << 2), value)
    store<f32>(out + ((<usize>y * <usize>size + <usize>x) << 2), value)
  }
  store<f32>(out + ((<usize>x * <usize>size + <usize>x) << 2), <f32>(0.5 * (1 + parentKinship(parents, parentCount, mother, father))))
}

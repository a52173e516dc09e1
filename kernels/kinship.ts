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
 * in the parents' matrix, row by row with the founder rule otherwise. `tables`: scratch of
 * 32 bytes per parent.
 */
export function offspringKinship(parents: usize, parentCount: i32, mothers: usize, fathers: usize, size: i32, out: usize, tables: usize): void {
  for (let x = 0; x < size; x++) {
    if (load<i32>(mothers + (<usize>x << 2)) >= parentCount || load<i32>(fathers + (<usize>x << 2)) >= parentCount) {
      for (let row = 0; row < size; row++) writeRow(parents, parentCount, mothers, fathers, size, out, row, size)
      return
    }
  }
  blockedKinship(parents, parentCount, mothers, fathers, size, out, tables)
}

/**
 * dst[z] = (r0[z], r1[z], r2[z], r3[z]) for z < count: four parents' rows of float32 kinship
 * (byte addresses r0…r3) interleaved, 16 bytes per z, by 4 × 4 transposes.
 */
function interleaveRows(dst: usize, r0: usize, r1: usize, r2: usize, r3: usize, count: i32): void {
  let z = 0
  for (; z + 3 < count; z += 4) {
    const offset = <usize>z << 2
    const a = v128.load(r0 + offset)
    const b = v128.load(r1 + offset)
    const c = v128.load(r2 + offset)
    const d = v128.load(r3 + offset)
    const ab01 = v128.shuffle<f32>(a, b, 0, 4, 1, 5)
    const ab23 = v128.shuffle<f32>(a, b, 2, 6, 3, 7)
    const cd01 = v128.shuffle<f32>(c, d, 0, 4, 1, 5)
    const cd23 = v128.shuffle<f32>(c, d, 2, 6, 3, 7)
    const at = dst + (<usize>z << 4)
    v128.store(at, v128.shuffle<f32>(ab01, cd01, 0, 1, 4, 5))
    v128.store(at + 16, v128.shuffle<f32>(ab01, cd01, 2, 3, 6, 7))
    v128.store(at + 32, v128.shuffle<f32>(ab23, cd23, 0, 1, 4, 5))
    v128.store(at + 48, v128.shuffle<f32>(ab23, cd23, 2, 3, 6, 7))
  }
  for (; z < count; z++) {
    const offset = <usize>z << 2
    const at = dst + (<usize>z << 4)
    store<f32>(at, load<f32>(r0 + offset))
    store<f32>(at + 4, load<f32>(r1 + offset))
    store<f32>(at + 8, load<f32>(r2 + offset))
    store<f32>(at + 12, load<f32>(r3 + offset))
  }
}

/** Lanes 2 and 3 of a float32 vector as doubles. */
// @ts-ignore: decorator
@inline function promoteHigh(v: v128): v128 {
  return f64x2.promote_low_f32x4(v128.shuffle<f32>(v, v, 2, 3, 2, 3))
}

/**
 * `offspringKinship` when no parent is a founder. Four members x … x + 3 at a time: their
 * mothers' rows of the parents' matrix are interleaved into one table and their fathers' rows
 * into another (`interleaveRows`, at `tables`: 2 × 16 bytes per parent), so that for each later
 * member y the four values of f(m_x, m_y), f(m_x, f_y), f(f_x, m_y), f(f_x, f_y) come in four
 * 128-bit loads. Each value is still summed in double precision as
 * ((f(m_x, m_y) + f(m_x, f_y)) + f(f_x, m_y)) + f(f_x, f_y), two members per SIMD vector, times
 * ¼, and rounded to float32 once — the same operations as one at a time. The four values go to
 * their row places and, as one 128-bit store, to their mirror places in row y.
 */
function blockedKinship(parents: usize, parentCount: i32, mothers: usize, fathers: usize, size: i32, out: usize, tables: usize): void {
  const rowBytes = <usize>size << 2
  const parentRowBytes = <usize>parentCount << 2
  const motherTable = tables
  const fatherTable = tables + (<usize>parentCount << 4)
  const quarter = f64x2.splat(0.25)
  let x: i32 = 0
  for (; x + 3 < size; x += 4) {
    for (let row = x; row < x + 4; row++) writeRow(parents, parentCount, mothers, fathers, size, out, row, x + 4)
    interleaveRows(motherTable,
      parents + <usize>load<i32>(mothers + (<usize>x << 2)) * parentRowBytes, parents + <usize>load<i32>(mothers + (<usize>(x + 1) << 2)) * parentRowBytes,
      parents + <usize>load<i32>(mothers + (<usize>(x + 2) << 2)) * parentRowBytes, parents + <usize>load<i32>(mothers + (<usize>(x + 3) << 2)) * parentRowBytes,
      parentCount)
    interleaveRows(fatherTable,
      parents + <usize>load<i32>(fathers + (<usize>x << 2)) * parentRowBytes, parents + <usize>load<i32>(fathers + (<usize>(x + 1) << 2)) * parentRowBytes,
      parents + <usize>load<i32>(fathers + (<usize>(x + 2) << 2)) * parentRowBytes, parents + <usize>load<i32>(fathers + (<usize>(x + 3) << 2)) * parentRowBytes,
      parentCount)
    const out0 = out + <usize>x * rowBytes
    let mirror = out + <usize>(x + 4) * rowBytes + (<usize>x << 2)
    for (let y = x + 4; y < size; y++, mirror += rowBytes) {
      const otherMother = <usize>load<i32>(mothers + (<usize>y << 2)) << 4
      const otherFather = <usize>load<i32>(fathers + (<usize>y << 2)) << 4
      const motherMother = v128.load(motherTable + otherMother)
      const motherFather = v128.load(motherTable + otherFather)
      const fatherMother = v128.load(fatherTable + otherMother)
      const fatherFather = v128.load(fatherTable + otherFather)
      const low = f64x2.mul(quarter, f64x2.add(f64x2.add(f64x2.add(
        f64x2.promote_low_f32x4(motherMother), f64x2.promote_low_f32x4(motherFather)),
        f64x2.promote_low_f32x4(fatherMother)), f64x2.promote_low_f32x4(fatherFather)))
      const high = f64x2.mul(quarter, f64x2.add(f64x2.add(f64x2.add(
        promoteHigh(motherMother), promoteHigh(motherFather)), promoteHigh(fatherMother)), promoteHigh(fatherFather)))
      const values = v128.shuffle<f32>(f32x4.demote_f64x2_zero(low), f32x4.demote_f64x2_zero(high), 0, 1, 4, 5)
      const column = <usize>y << 2
      store<f32>(out0 + column, f32x4.extract_lane(values, 0))
      store<f32>(out0 + rowBytes + column, f32x4.extract_lane(values, 1))
      store<f32>(out0 + 2 * rowBytes + column, f32x4.extract_lane(values, 2))
      store<f32>(out0 + 3 * rowBytes + column, f32x4.extract_lane(values, 3))
      v128.store(mirror, values)
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

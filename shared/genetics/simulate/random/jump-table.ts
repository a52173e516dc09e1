import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'

/**
 * Entries of one jump table: for each of the 16 bytes of the 128-bit state
 * (4 words × 4 bytes) and each of its 256 values, the 4 words of the image.
 */
const TABLE_SIZE = 16 * 256 * 4

/** levels[i]: the table of 2^i jumps, built on first use. */
const levels: Int32Array[] = []

/** Applies a jump table to a state (16 lookups). */
function applyTable(lookup: Int32Array, state: ArrayLike<number>): [number, number, number, number] {
  let out0 = 0
  let out1 = 0
  let out2 = 0
  let out3 = 0
  for (let word = 0; word < 4; word++) {
    const value = state[word] ?? 0
    for (let byte = 0; byte < 4; byte++) {
      const base = ((word * 4 + byte) * 256 + ((value >>> (8 * byte)) & 255)) * 4
      // base + 3 < TABLE_SIZE by construction, hence the `as number` reads.
      out0 ^= lookup[base] as number
      out1 ^= lookup[base + 1] as number
      out2 ^= lookup[base + 2] as number
      out3 ^= lookup[base + 3] as number
    }
  }
  return [out0, out1, out2, out3]
}

/** The byte table of a linear map given by the images of the 128 unit states. */
function tableFromImages(images: Int32Array): Int32Array {
  const lookup = new Int32Array(TABLE_SIZE)
  for (let position = 0; position < 16; position++) {
    for (let value = 1; value < 256; value++) {
      const base = (position * 256 + value) * 4
      // The table of `value` is that of `value` without its lowest bit, xor the image of that bit.
      const lowest = value & -value
      const bit = position * 8 + Math.log2(lowest)
      const rest = (position * 256 + (value ^ lowest)) * 4
      for (let out = 0; out < 4; out++) lookup[base + out] = (lookup[rest + out] as number) ^ (images[bit * 4 + out] as number)
    }
  }
  return lookup
}

/** The unit state with only `bit` set (word bit ÷ 32, bit bit mod 32). */
function unitState(bit: number): number[] {
  const state = [0, 0, 0, 0]
  state[bit >>> 5] = 1 << (bit & 31)
  return state
}

/** The table of 2^level jumps. */
function levelTable(level: number): Int32Array {
  for (let built = levels.length; built <= level; built++) {
    const images = new Int32Array(128 * 4)
    for (let bit = 0; bit < 128; bit++) {
      if (built === 0) {
        const generator = xoroshiro128plusFromState(unitState(bit))
        generator.jump()
        images.set(generator.getState(), bit * 4)
      } else {
        const half = levels[built - 1] as Int32Array // built in order
        images.set(applyTable(half, applyTable(half, unitState(bit))), bit * 4)
      }
    }
    levels.push(tableFromImages(images))
  }
  return levels[level] as Int32Array // built above
}

/**
 * The state of a xoroshiro128+ generator after `jumps` jumps of 2⁶⁴ steps
 * each (pure-rand's `jump()`), in O(log jumps) table lookups.
 *
 * Why: a worker's block of replicates starting at replicate r needs the
 * stream after r + 1 jumps; jumping one at a time (128 generator steps each)
 * made splitting R replicates into B blocks cost O(R²/B) jumps in all.
 *
 * Method: the jump is linear over GF(2) in the 128-bit state, so 2^i jumps
 * are a fixed 128 × 128 bit matrix, kept as byte tables (16 lookups per
 * application; built once, the first from pure-rand's own `jump()`, each next
 * by squaring); `jumps` is applied bit by bit. Exactly pure-rand's result
 * (checked by a test against repeated `jump()`).
 *
 * @param state - [s01, s00, s11, s10] as pure-rand's `getState()` returns it
 * @param jumps - number of jumps, integer in [0, 2³¹)
 * @returns the jumped state, a new array in the same order
 * @example jumpedState(xoroshiro128plus(1).getState(), 1) // the state of xoroshiro128plus(1) after one jump()
 */
export function jumpedState(state: readonly number[], jumps: number): number[] {
  let current: ArrayLike<number> = state
  for (let level = 0, remaining = jumps; remaining > 0; level++, remaining >>>= 1) {
    if (remaining & 1) current = applyTable(levelTable(level), current)
  }
  return Array.from(current)
}

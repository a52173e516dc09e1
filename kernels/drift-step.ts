// AssemblyScript source of the drift-step kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/drift-step-wasm.ts; see that folder's drift-step-kernel.ts).
//
// It runs Wright–Fisher generations "i copies of A among n genes → Binomial(n, p′(i/n))" from the
// constants that DriftStepCache (shared/genetics/simulate/establishment/drift-step-cache.ts) keeps
// per count in this module's memory, and it continues the replicate's xoroshiro128+ stream. Every
// operation mirrors the TypeScript sampler (`DriftStepCache.draw`, `binomialInversionFromTable`,
// `binomialBtrdFromUniform` with an acceptance table) in the same order on the same IEEE doubles,
// and the logarithm is the host's Math.log (imported), so each draw is bit-for-bit the one the
// TypeScript code makes. tests/unit/simulation/drift-step-kernel.test.ts checks that.
// The logarithm is fdlibm's __ieee754_log, the algorithm behind V8's Math.log (v8/src/base/ieee754.cc),
// written out operation for operation; the test compares it with Math.log on millions of arguments.
//
// Memory layout (bytes), shared with drift-step-kernel.ts:
//   0 + l·LANE_BYTES            lane l (see `runLanes`)
//   gridBase + j·4              the trajectory grid's generations (int32)
//   headerBase + i·STRIDE·8     per-count constants: state, binomialSetup's 7 entries, 0.86·v_r, 2a, table length
//   tableBase + i·TABLE_SLOT·8  per-count table: inversion pmf or BTRD acceptance table

const LANE_BYTES: usize = 320
const RECORDS_BYTE: usize = 64
const RECORD_CAPACITY: i32 = 64
const RUNNING: i32 = 1
const STOPPED: i32 = 2
const STRIDE: usize = 12
const TABLE_SLOT: usize = 44
const EMPTY: f64 = 0
const REFLECTED: f64 = 2
const TABLED: f64 = 2
const RATIO_REACH: f64 = 15
const TWO_POW_MINUS_32: f64 = 2.3283064365386963e-10

/** The two 64-bit words of the xoroshiro128+ state; pure-rand keeps each as two int32 halves. */
let state0: i64 = 0
let state1: i64 = 0

/**
 * pure-rand's xoroshiro128+ `next()`: the low 32 bits of s0 + s1, then s1 ^= s0,
 * s0 = rotl(s0, 24) ^ s1 ^ (s1 << 16), s1 = rotl(s1, 37) (Blackman & Vigna 2018). pure-rand
 * computes the same on 32-bit halves ([s01, s00, s11, s10] = [high s0, low s0, high s1, low s1]).
 */
@inline function nextInt(): i32 {
  const out = <i32>(state0 + state1)
  const mixed = state1 ^ state0
  state0 = rotl<i64>(state0, 24) ^ mixed ^ (mixed << 16)
  state1 = rotl<i64>(mixed, 37)
  return out
}

/** `uniform32`: (next() mod 2³²)·2⁻³². */
@inline function uniform32(): f64 {
  return <f64>(<u32>nextInt()) * TWO_POW_MINUS_32
}

const LN2_HI: f64 = 6.93147180369123816490e-01
const LN2_LO: f64 = 1.90821492927058770002e-10
const TWO54: f64 = 1.80143985094819840000e+16
const LG1: f64 = 6.666666666666735130e-01
const LG2: f64 = 3.999999999940941908e-01
const LG3: f64 = 2.857142874366239149e-01
const LG4: f64 = 2.222219843214978396e-01
const LG5: f64 = 1.818357216161805012e-01
const LG6: f64 = 1.531383769920937332e-01
const LG7: f64 = 1.479819860511658591e-01

/**
 * Natural logarithm, fdlibm's e_log.c (Sun Microsystems 1993): x = 2^k·(1 + f) with √2/2 < 1 + f < √2,
 * s = f/(2 + f), log(1 + f) = f − s·(f − R(s²)) with a degree-14 minimax R; error < 1 ulp. Exported
 * as `log` for the comparison with Math.log.
 */
export function log(x: f64): f64 {
  let hx = <i32>(reinterpret<u64>(x) >> 32)
  const lx = <u32>reinterpret<u64>(x)
  let k: i32 = 0
  if (hx < 0x00100000) {
    if (((hx & 0x7fffffff) | lx) == 0) return -Infinity
    if (hx < 0) return NaN
    k -= 54
    x *= TWO54
    hx = <i32>(reinterpret<u64>(x) >> 32)
  }
  if (hx >= 0x7ff00000) return x + x
  k += (hx >> 20) - 1023
  hx &= 0x000fffff
  let i = (hx + 0x95f64) & 0x100000
  x = reinterpret<f64>((<u64>(<u32>(hx | (i ^ 0x3ff00000))) << 32) | (reinterpret<u64>(x) & 0xffffffff))
  k += i >> 20
  const f = x - 1.0
  if ((0x000fffff & (2 + hx)) < 3) {
    if (f == 0) {
      if (k == 0) return 0
      const dk = <f64>k
      return dk * LN2_HI + dk * LN2_LO
    }
    const r = f * f * (0.5 - 0.33333333333333333 * f)
    if (k == 0) return f - r
    const dk = <f64>k
    return dk * LN2_HI - ((r - dk * LN2_LO) - f)
  }
  const s = f / (2.0 + f)
  const dk = <f64>k
  const z = s * s
  i = hx - 0x6147a
  const w = z * z
  const j = 0x6b851 - hx
  const t1 = w * (LG2 + w * (LG4 + w * LG6))
  const t2 = z * (LG1 + w * (LG3 + w * (LG5 + w * LG7)))
  i |= j
  const r = t2 + t1
  if (i > 0) {
    const hfsq = 0.5 * f * f
    if (k == 0) return f - (hfsq - s * (hfsq + r))
    return dk * LN2_HI - ((hfsq - (s * (hfsq + r) + dk * LN2_LO)) - f)
  }
  if (k == 0) return f - s * (f - r)
  return dk * LN2_HI - ((s * (f - r) - dk * LN2_LO) - f)
}

/** `binomialInversionFromTable` on the table at `table` with `length` entries. */
function inversionFromTable(table: usize, length: i32): f64 {
  const bound = length - 1
  let successes: i32 = 0
  let remaining = uniform32()
  while (remaining > load<f64>(table + (<usize>successes << 3))) {
    successes++
    if (successes > bound) {
      successes = 0
      remaining = uniform32()
    } else {
      remaining -= load<f64>(table + (<usize>(successes - 1) << 3))
    }
  }
  return <f64>successes
}

/** ln k! − [½ln(2π) + (k + ½)ln(k + 1) − (k + 1)], as `stirlingTail` in binomial.ts. */
function stirlingTail(k: f64): f64 {
  if (k <= 9) {
    const index = <i32>k
    if (index == 0) return 0.08106146679532726
    if (index == 1) return 0.0413406959554093
    if (index == 2) return 0.02767792568499834
    if (index == 3) return 0.020790672103765093
    if (index == 4) return 0.016644691189821193
    if (index == 5) return 0.013876128823070748
    if (index == 6) return 0.01189670994589177
    if (index == 7) return 0.010411265261972096
    if (index == 8) return 0.009255462182712733
    return 0.00833056343336287
  }
  const next = k + 1
  const square = next * next
  return (1.0 / 12 - (1.0 / 360 - 1.0 / 1260 / square) / square) / next
}

/**
 * `binomialBtrdFromUniform` with an acceptance table: BTRD steps 1–3.4 from the first uniform v.
 * `setup` points at binomialSetup's entry 0 (the branch code), `acceptance` at the table.
 */
function btrd(firstUniform: f64, trials: f64, setup: usize, acceptance: usize): f64 {
  const spread = load<f64>(setup + 8)
  const b = load<f64>(setup + 16)
  const a = load<f64>(setup + 24)
  const c = load<f64>(setup + 32)
  const boxLimit = load<f64>(setup + 40)
  const quickLimit = 0.86 * boxLimit
  let v = firstUniform
  while (true) {
    let u: f64
    if (v <= quickLimit) {
      u = v / boxLimit - 0.43
      return Math.floor((2 * a / (0.5 - Math.abs(u)) + b) * u + c)
    }
    if (v >= boxLimit) {
      u = uniform32() - 0.5
    } else {
      u = v / boxLimit - 0.93
      u = (u < 0 ? -0.5 : 0.5) - u
      v = uniform32() * boxLimit
    }
    const us = 0.5 - Math.abs(u)
    const k = Math.floor((2 * a / us + b) * u + c)
    if (k < 0 || k > trials) {
      v = uniform32()
      continue
    }
    const odds = load<f64>(acceptance)
    const alpha = load<f64>(acceptance + 8)
    const mode = load<f64>(acceptance + 16)
    const scaled = v * alpha / (a / (us * us) + b)
    const distance = Math.abs(k - mode)
    if (distance <= RATIO_REACH) {
      const ratio = load<f64>(acceptance + (<usize>(<i32>(k - mode + RATIO_REACH) + 4) << 3))
      if (scaled <= ratio) return k
      v = uniform32()
      continue
    }
    const logV = log(scaled)
    const variance = spread * spread
    const rho = (distance / variance) * ((distance * (distance / 3 + 0.625) + 1.0 / 6) / variance + 0.5)
    const t = -distance * distance / (2 * variance)
    if (logV < t - rho) return k
    if (logV > t + rho) {
      v = uniform32()
      continue
    }
    const bound = load<f64>(acceptance + 24)
      + (trials + 1) * log((trials - mode + 1) / (trials - k + 1))
      + (k + 0.5) * log(odds * (trials - k + 1) / (k + 1))
      - stirlingTail(k) - stirlingTail(trials - k)
    if (logV <= bound) return k
    v = uniform32()
  }
}

/** One Wright–Fisher draw from the count whose header is at `header` (state already read). */
// @ts-ignore: decorator
@inline function drawFrom(header: usize, state: f64, table: usize, genes: i32, trials: f64): i32 {
  let drawn: f64
  if (state > TABLED) {
    drawn = inversionFromTable(table, <i32>load<f64>(header + 80))
  } else {
    const v = uniform32()
    if (v <= load<f64>(header + 64)) {
      const u = v / load<f64>(header + 48) - 0.43
      drawn = Math.floor((load<f64>(header + 72) / (0.5 - Math.abs(u)) + load<f64>(header + 24)) * u + load<f64>(header + 40))
    } else {
      drawn = btrd(v, trials, header + 8, table)
    }
  }
  return state == REFLECTED || state == REFLECTED + TABLED ? genes - <i32>drawn : <i32>drawn
}

/**
 * Advances the running lanes (replicates) one generation each, round after round, until at least
 * one lane stops: it reached its end generation, its count fixed or was lost, its next count's
 * constants are not filled yet, or its record buffer is full. A lane records its count in its
 * buffer before the draw of every generation listed in the grid. Interleaving independent
 * replicates lets the processor overlap their dependency chains (a single chain waits on two
 * divisions and a load per generation).
 *
 * Lane record (int32 words, LANE_BYTES apart from byte 0): 0–3 generator state as two
 * little-endian 64-bit words s0, s1, 4 count, 5 generation, 6 end generation, 7 index of the next
 * grid point, 8 records in the buffer, 9 status (0 idle, 1 running, 2 stopped), 10 the next
 * generation that needs a look (min of end and the next grid point), 16… record buffer.
 */
export function runLanes(laneCount: i32, genes: i32, headerBase: usize, tableBase: usize, gridBase: usize, gridLength: i32): void {
  const trials = <f64>genes
  while (true) {
    let running = false
    let stopped = false
    for (let lane = 0; lane < laneCount; lane++) {
      const at = <usize>lane * LANE_BYTES
      if (load<i32>(at + 36) != RUNNING) continue
      running = true
      const copies = load<i32>(at + 16)
      const generation = load<i32>(at + 20)
      if (generation == load<i32>(at + 40)) {
        const end = load<i32>(at + 24)
        if (generation >= end) {
          store<i32>(at + 36, STOPPED)
          stopped = true
          continue
        }
        // A grid point: record the count before drawing.
        const records = load<i32>(at + 32)
        if (records == RECORD_CAPACITY) {
          store<i32>(at + 36, STOPPED)
          stopped = true
          continue
        }
        store<i32>(at + RECORDS_BYTE + (<usize>records << 2), copies)
        store<i32>(at + 32, records + 1)
        const gridIndex = load<i32>(at + 28) + 1
        store<i32>(at + 28, gridIndex)
        const nextGrid = gridIndex < gridLength ? load<i32>(gridBase + (<usize>gridIndex << 2)) : end
        store<i32>(at + 40, nextGrid < end ? nextGrid : end)
      }
      const header = headerBase + <usize>copies * STRIDE * 8
      const state = load<f64>(header)
      if (state == EMPTY) {
        store<i32>(at + 36, STOPPED)
        stopped = true
        continue
      }
      state0 = load<i64>(at)
      state1 = load<i64>(at + 8)
      const next = drawFrom(header, state, tableBase + <usize>copies * TABLE_SLOT * 8, genes, trials)
      store<i64>(at, state0)
      store<i64>(at + 8, state1)
      store<i32>(at + 16, next)
      store<i32>(at + 20, generation + 1)
      if (next == 0 || next == genes) {
        store<i32>(at + 36, STOPPED)
        stopped = true
      }
    }
    if (stopped || !running) return
  }
}

import { binomialBtrdAcceptanceTable, binomialBtrdFromUniform, binomialInversionFromTable, firstUniformSlot, binomialInversionTable, binomialSetup } from '../random/binomial'
import type { RandomStream } from '../random/streams'
import { uniform32 } from '../random/uniform'
import { DriftStepKernel, KERNEL_HEADER_STRIDE, KERNEL_TABLE_SLOT } from '../kernels/drift-step-kernel'
import { frequencyAfterSelection } from './selection-step'

/** Largest number of sampled genes n for which setups are kept (at most about 5 MB of setups per n). */
export const MAXIMUM_CACHED_GENES = 65_536

/**
 * Entries per allele count: the state, the sampler setup (7 entries, p* last),
 * then BTRD step 1's bound 0.86·v_r and 2a (BTRD counts only), the length of
 * an inversion count's pmf table and one spare (the kernel's layout).
 */
const STRIDE = KERNEL_HEADER_STRIDE
/** Where BTRD's b, a, c and v_r (`binomialSetup` entries 2–5) and the two products sit, from the count's offset. */
const SETUP_B = 3
const SETUP_A = 4
const SETUP_C = 5
const SETUP_BOX_LIMIT = 6
const QUICK_LIMIT = 8
const TWICE_A = 9
const TABLE_LENGTH = 10
const EMPTY = 0
const DIRECT = 1
const REFLECTED = 2
/** Added to DIRECT/REFLECTED when the count is drawn from its pmf table. */
const TABLED = 2

/**
 * One Wright–Fisher generation from "i copies of A among n genes":
 * Binomial(n, p′(i/n)) with p′ the frequency after selection (SCIENCE.md
 * eq. 2.1), with the selection step and the binomial sampler's constants
 * (`binomialSetup`) kept per count i in one flat array.
 *
 * Why: replicates revisit the same counts over and over; keeping the
 * constants saves a square root, divisions and an exp/log per draw, and the
 * flat array (12 doubles per count) stays in cache; counts drawn by
 * inversion also keep their pmf (no division per step), the others go
 * straight to BTRD with its constants read from the array. The draw is
 * bit-for-bit the one `binomialDraw(random, n, p′)` would make, so using the
 * cache or not never changes a result.
 *
 * The arrays live in the memory of a `DriftStepKernel`, which runs stretches
 * of generations of several replicates with the same draws in WebAssembly
 * (`kernel`, `prepare`);
 * `draw` is the same step in TypeScript, for single generations and as the
 * kernel's reference.
 */
export class DriftStepCache {
  readonly genes: number
  private readonly s: number
  private readonly h: number
  /** The WebAssembly kernel whose memory holds the constants below. */
  readonly kernel: DriftStepKernel
  private readonly entries: Float64Array
  /** pmf tables of the counts drawn by inversion (few: those with n·p′ < 10 or n·(1 − p′) < 10), views of the kernel's memory. */
  private readonly inversionTables: (Float64Array | undefined)[]
  /** BTRD acceptance tables of the other counts, made on their first draw (see `binomialBtrdAcceptanceTable`). */
  private readonly acceptanceTables: (Float64Array | undefined)[]

  /**
   * @param genes - n, genes sampled per generation, integer in [1, MAXIMUM_CACHED_GENES]
   * @param s - selection coefficient, 1 + s > 0
   * @param h - dominance, 1 + hs > 0
   * @param grid - generations at which the kernel's lanes record their count (none by default)
   */
  constructor(genes: number, s: number, h: number, grid: Int32Array = new Int32Array(0)) {
    this.genes = genes
    this.s = s
    this.h = h
    this.kernel = new DriftStepKernel(genes, grid)
    this.entries = this.kernel.headers
    this.inversionTables = new Array<Float64Array | undefined>(genes + 1).fill(undefined)
    this.acceptanceTables = new Array<Float64Array | undefined>(genes + 1).fill(undefined)
  }

  /**
   * Next generation's number of A copies.
   *
   * @param random - seeded generator
   * @param copies - i, integer in [1, n − 1]
   * @returns an integer in [0, n]
   */
  draw(random: RandomStream, copies: number): number {
    const offset = copies * STRIDE
    const entries = this.entries
    if (entries[offset] === EMPTY) this.fill(copies, offset)
    // Entries of a filled count are defined, hence the `as number` reads.
    const state = entries[offset] as number
    // A count not drawn from a table uses the BTRD branch (binomialInversionTable
    // returns a table for every inversion setup).
    let drawn: number
    if (state > TABLED) {
      drawn = binomialInversionFromTable(random, this.inversionTables[copies] as Float64Array) // set with the state
    } else {
      // BTRD step 1 (v below 0.86·v_r: about two draws in three in the
      // speed benchmark's model) written out here with the same operations
      // as `binomialBtrdFromUniform`, which takes over with that v otherwise.
      const v = uniform32(random)
      if (v <= (entries[offset + QUICK_LIMIT] as number)) {
        const u = v / (entries[offset + SETUP_BOX_LIMIT] as number) - 0.43
        drawn = Math.floor(((entries[offset + TWICE_A] as number) / (0.5 - Math.abs(u)) + (entries[offset + SETUP_B] as number)) * u + (entries[offset + SETUP_C] as number))
      } else {
        firstUniformSlot[0] = v
        drawn = binomialBtrdFromUniform(random, this.genes, entries, offset + 1, this.acceptanceTables[copies])
      }
    }
    return state === REFLECTED || state === REFLECTED + TABLED ? this.genes - drawn : drawn
  }

  /**
   * Makes sure the constants of count i are filled (what the kernel needs
   * before it can draw from i; `draw` does it by itself).
   *
   * @param copies - i, integer in [1, n − 1]
   */
  prepare(copies: number): void {
    const offset = copies * STRIDE
    if (this.entries[offset] === EMPTY) this.fill(copies, offset)
  }

  private fill(copies: number, offset: number): void {
    const selected = frequencyAfterSelection(copies / this.genes, this.s, this.h)
    const reflected = selected > 0.5
    const probability = reflected ? 1 - selected : selected
    this.entries[offset] = reflected ? REFLECTED : DIRECT
    binomialSetup(this.genes, probability, this.entries, offset + 1)
    const table = binomialInversionTable(this.genes, this.entries, offset + 1)
    const slot = copies * KERNEL_TABLE_SLOT
    if (table.length > 0) {
      if (table.length > KERNEL_TABLE_SLOT) throw new Error(`DriftStepCache: pmf table of ${table.length} entries exceeds its slot`) // cannot happen for n·p < 10 (see KERNEL_TABLE_SLOT)
      this.inversionTables[copies] = this.storeTable(slot, table)
      this.entries[offset + TABLE_LENGTH] = table.length
      this.entries[offset] = (reflected ? REFLECTED : DIRECT) + TABLED
    } else {
      this.acceptanceTables[copies] = this.storeTable(slot, binomialBtrdAcceptanceTable(this.genes, this.entries, offset + 1))
      // The products BTRD forms on every draw (0.86·v_r, 2·a), computed the same way.
      this.entries[offset + QUICK_LIMIT] = 0.86 * (this.entries[offset + SETUP_BOX_LIMIT] as number)
      this.entries[offset + TWICE_A] = 2 * (this.entries[offset + SETUP_A] as number)
    }
  }

  /** Copies a table into its slot of the kernel's memory and returns the view. */
  private storeTable(slot: number, table: Float64Array): Float64Array {
    const view = this.kernel.tables.subarray(slot, slot + table.length)
    view.set(table)
    return view
  }
}

import { kinshipWasm } from './kinship-wasm'
import { kernelMemory, kernelModule } from './instantiate'

type OffspringKinshipExport = (parents: number, parentCount: number, mothers: number, fathers: number, size: number, out: number, tables: number) => void

/**
 * The WebAssembly kinship kernel (kernels/kinship.ts) for one lineage of generations: the
 * pedigree kinship of each generation from its parents', the same float32 values as
 * `offspringKinship` (shared/genetics/simulate/rescue/kinship.ts), written into one of two
 * matrices in the kernel's memory used in turn.
 *
 * Why: the N × N matrix is a fifth of the rescue model's time in TypeScript; the kernel does the
 * same additions without bounds checks. The returned matrix is a view of the kernel's memory and
 * stays valid until the generation after next is written (the breeding generation's pedigree
 * holds one matrix, its offspring's the other). The memory is never grown, which would detach
 * every view: when a generation needs more room, a larger memory replaces it, and views of the
 * old one stay valid.
 */
export class KinshipKernel {
  private memory: WebAssembly.Memory | null = null
  private run: OffspringKinshipExport | null = null
  /** Floats per matrix slot, int32 parent numbers per parent array, and parents the interleaved tables have room for. */
  private matrixCapacity = 0
  private parentCapacity = 0
  private tableCapacity = 0

  /**
   * @param parentKinship - the parents' matrix (parentCount × parentCount), anywhere
   * @param parentCount - number of parents with rows in the matrix
   * @param mothers - each member's mother (numbers ≥ parentCount are founders)
   * @param fathers - each member's father
   * @returns the members' matrix, a view of the kernel's memory
   */
  offspringKinship(parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array): Float32Array {
    const size = mothers.length
    const parentEntries = parentCount * parentCount
    if (!this.memory || Math.max(size * size, parentEntries) > this.matrixCapacity || size > this.parentCapacity || parentCount > this.tableCapacity) {
      this.allocate(Math.max(size * size, parentEntries), size, parentCount)
    }
    const memory = this.memory as WebAssembly.Memory // allocated above
    const slotBytes = this.matrixCapacity * 4
    // The parents' matrix: where it already is (a slot of this memory), else copied into slot 1.
    let parentsByte = slotBytes
    if (parentKinship.buffer === memory.buffer && (parentKinship.byteOffset === 0 || parentKinship.byteOffset === slotBytes)) {
      parentsByte = parentKinship.byteOffset
    } else if (parentEntries > 0) {
      new Float32Array(memory.buffer, parentsByte, parentEntries).set(parentKinship.subarray(0, parentEntries))
    }
    const outByte = parentsByte === 0 ? slotBytes : 0
    const mothersByte = 2 * slotBytes
    const fathersByte = mothersByte + this.parentCapacity * 4
    const tablesByte = fathersByte + this.parentCapacity * 4
    new Int32Array(memory.buffer, mothersByte, size).set(mothers)
    new Int32Array(memory.buffer, fathersByte, size).set(fathers)
    ;(this.run as OffspringKinshipExport)(parentsByte, parentCount, mothersByte, fathersByte, size, outByte, tablesByte)
    return new Float32Array(memory.buffer, outByte, size * size)
  }

  /**
   * A fresh memory with room for matrices of `entries` floats, `members` members' parent numbers
   * and the kernel's interleaved tables for `parents` parents (a quarter more of each).
   */
  private allocate(entries: number, members: number, parents: number): void {
    this.matrixCapacity = Math.ceil(entries * 1.25) + 16
    this.parentCapacity = Math.ceil(members * 1.25) + 16
    this.tableCapacity = Math.ceil(parents * 1.25) + 16
    const bytes = 2 * this.matrixCapacity * 4 + 2 * this.parentCapacity * 4 + 32 * this.tableCapacity
    this.memory = kernelMemory(bytes)
    const instance = new WebAssembly.Instance(kernelModule(kinshipWasm), { env: { memory: this.memory } })
    this.run = instance.exports.offspringKinship as OffspringKinshipExport
  }
}

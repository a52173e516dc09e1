/**
 * Writes the invented demo genotype tables in this folder (run once; the CSV files are
 * committed): `npx tsx seeds/demo/genotypes/generate.ts`.
 *
 * Invented data, made with a fixed-seed generator (mulberry32, seed 20240611): twelve
 * microsatellite loci with invented names and allele sizes; one shared ancestral allele-frequency
 * set; each subpopulation drifts from it by a Wright–Fisher process at its working Ne for the
 * generations it has been isolated (seeds/demo/subpopulations.json), at 2.5 × today's working Ne
 * because the declines are recent; then animals are sampled
 * with a little extra homozygosity in the smallest subpopulations and about 3 % missing
 * genotypes (written as 0,0). Nothing here is real data.
 */
import { readFileSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

const folder = dirname(fileURLToPath(import.meta.url))

/** Small, well-known 32-bit generator; enough for invented demo data. */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6D2B79F5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const random = mulberry32(20240611)
const pick = (weights: readonly number[]): number => {
  let total = 0
  for (const weight of weights) total += weight
  let target = random() * total
  for (let index = 0; index < weights.length; index++) {
    target -= weights[index] ?? 0
    if (target <= 0) return index
  }
  return weights.length - 1
}

interface Locus { name: string, alleles: number[], frequencies: number[] }

const LOCUS_COUNT = 12
const loci: Locus[] = []
for (let index = 0; index < LOCUS_COUNT; index++) {
  const alleleCount = 4 + Math.floor(random() * 8)
  const repeat = index % 3 === 0 ? 4 : 2
  const start = 110 + Math.floor(random() * 120)
  const alleles = Array.from({ length: alleleCount }, (_, a) => start + a * repeat)
  const raw = alleles.map(() => -Math.log(1 - random())) // Dirichlet(1, …, 1)
  const sum = raw.reduce((s, v) => s + v, 0)
  loci.push({ name: `Neph${String(index + 1).padStart(2, '0')}`, alleles, frequencies: raw.map(v => v / sum) })
}

interface Plan { name: string, file: string, code: string, sampledYear: number, sampleSize: number, extraHomozygosity: number }

const plans: Plan[] = [
  { name: 'Quillmoss Ridge', file: 'invented-quillmoss-ridge-2023.csv', code: 'QR', sampledYear: 2023, sampleSize: 30, extraHomozygosity: 0.01 },
  { name: 'Mossgate Plateau', file: 'invented-mossgate-plateau-2022.csv', code: 'MP', sampledYear: 2022, sampleSize: 28, extraHomozygosity: 0.01 },
  { name: 'Ashfern Hollow', file: 'invented-ashfern-hollow-2023.csv', code: 'AF', sampledYear: 2023, sampleSize: 26, extraHomozygosity: 0.02 },
  { name: 'Brackenveil Knob', file: 'invented-brackenveil-knob-2024.csv', code: 'BK', sampledYear: 2024, sampleSize: 22, extraHomozygosity: 0.05 },
  { name: 'Cinderbrook Cove', file: 'invented-cinderbrook-cove-2024.csv', code: 'CC', sampledYear: 2024, sampleSize: 20, extraHomozygosity: 0.08 },
  { name: 'Owlfeather Bald', file: 'invented-owlfeather-bald-2024.csv', code: 'OB', sampledYear: 2024, sampleSize: 14, extraHomozygosity: 0.12 },
]

const subpopulations = (JSON.parse(readFileSync(join(folder, '..', 'subpopulations.json'), 'utf8')) as {
  subpopulations: { name: string, workingNe: number | null, yearsIsolated: number, generationTimeYears: number, census: { adults: number }[] }[]
}).subpopulations

function drift(frequencies: number[], effectiveSize: number, generations: number): number[] {
  let current = [...frequencies]
  const copies = Math.max(2, Math.round(2 * effectiveSize))
  for (let generation = 0; generation < generations; generation++) {
    const counts = current.map(() => 0)
    for (let copy = 0; copy < copies; copy++) counts[pick(current)]! += 1 // index from pick is in range
    current = counts.map(count => count / copies)
  }
  return current
}

const manifest: { file: string, subpopulation: string, sampledYear: number, markerType: 'microsatellite' }[] = []
for (const plan of plans) {
  const record = subpopulations.find(s => s.name === plan.name)
  if (!record) throw new Error(`no subpopulation ${plan.name}`)
  const lastCensus = record.census[record.census.length - 1]?.adults ?? 100
  // The declines are recent: drift over the isolation period at 2.5 × today's working Ne.
  const effectiveSize = Math.round(2.5 * (record.workingNe ?? Math.max(5, Math.round(lastCensus * 0.15))))
  const generations = Math.round(record.yearsIsolated / record.generationTimeYears)
  const drifted = loci.map(locus => drift(locus.frequencies, effectiveSize, generations))
  const header = ['id', ...loci.flatMap(locus => [`${locus.name}_1`, `${locus.name}_2`])]
  const rows = [header.join(',')]
  for (let animal = 1; animal <= plan.sampleSize; animal++) {
    const cells = [`${plan.code}-${String(animal).padStart(3, '0')}`]
    loci.forEach((locus, index) => {
      const frequencies = drifted[index] ?? locus.frequencies
      if (random() < 0.03) {
        cells.push('0', '0')
        return
      }
      const first = locus.alleles[pick(frequencies)] ?? 0
      const second = random() < plan.extraHomozygosity ? first : locus.alleles[pick(frequencies)] ?? 0
      const [low, high] = first <= second ? [first, second] : [second, first]
      cells.push(String(low), String(high))
    })
    rows.push(cells.join(','))
  }
  writeFileSync(join(folder, plan.file), `${rows.join('\n')}\n`)
  manifest.push({ file: plan.file, subpopulation: plan.name, sampledYear: plan.sampledYear, markerType: 'microsatellite' })
  console.log(`${plan.file}: Ne ${effectiveSize}, ${generations} generations, ${plan.sampleSize} animals`)
}

writeFileSync(join(folder, 'manifest.json'), `${JSON.stringify({
  about: 'Invented demo genotype tables (microsatellites, invented loci and allele sizes), made by generate.ts with a fixed seed. Not real data.',
  source: 'Invented demo data',
  datasets: manifest,
}, null, 2)}\n`)

/**
 * Runs one simulation model once, from the engine under ENGINE_ROOT (default: this checkout),
 * for bench/count-instructions.ts, which runs it under valgrind and counts the instructions
 * executed. Arguments: model (`allele-frequency` or `individual-based`) and a replicate count.
 * The models are bench/simulate.bench.ts's, the individual-based one at a smaller size
 * (N = 300, 30 generations) so that a run under valgrind takes about a minute.
 */
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import type { runEstablishmentReplicates as RunEstablishment } from '../shared/genetics/simulate/establishment'
import type { runRescueReplicates as RunRescue } from '../shared/genetics/simulate/rescue'
import { ALLELE_FREQUENCY_BENCH_PARAMS, rescueParams } from './simulate.bench'

const [model, count] = process.argv.slice(2)
const replicates = Number(count)
const root = process.env.ENGINE_ROOT ?? join(import.meta.dirname, '..')
if (model === 'allele-frequency') {
  const engine = await import(pathToFileURL(join(root, 'shared/genetics/simulate/establishment/index.ts')).href) as { runEstablishmentReplicates: typeof RunEstablishment }
  engine.runEstablishmentReplicates(ALLELE_FREQUENCY_BENCH_PARAMS, { seed: 1, firstReplicate: 0, replicates })
} else if (model === 'individual-based') {
  const engine = await import(pathToFileURL(join(root, 'shared/genetics/simulate/rescue/index.ts')).href) as { runRescueReplicates: typeof RunRescue }
  engine.runRescueReplicates(rescueParams(300, 2000, 200, 30, 0), { seed: 7, firstReplicate: 0, replicates })
} else {
  throw new Error(`Unknown model ${String(model)}: use allele-frequency or individual-based`)
}

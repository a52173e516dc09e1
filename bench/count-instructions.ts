/**
 * `npm run bench:instructions -- <git revision>`: instructions the simulation engine executes
 * per replicate, in this checkout and in an earlier revision, counted by valgrind (cachegrind
 * without its cache model).
 *
 * Why: on a shared virtual machine CPU time moves by 20–40 % between runs of the same code,
 * which hides changes of 5–10 %. An instruction count does not depend on the neighbours: two
 * runs of one checkout agree to well under 1 %. Between two checkouts of the same engine code
 * it has differed by up to 5 % (V8's choices still depend on the module paths), so read
 * differences under 5 % as noise. It does not see memory stalls, so a change that only improves
 * cache use (same instructions, better order) shows up only in `npm run bench:compare`.
 *
 * Method: each model runs twice per engine, with R and 3R replicates, under
 * `valgrind --tool=cachegrind --cache-sim=no` with V8 in its predictable mode (compiling and
 * collecting garbage on the main thread, on a fixed schedule, so that the count does not depend
 * on when a background job finishes), fixed hash and random seeds, and tsx's transform cache
 * off (both runs then translate the same files); the difference divided by 2R is the cost of
 * one replicate without start-up and module loading. Needs valgrind (Debian package `valgrind`).
 */
import { spawnSync } from 'node:child_process'
import { join } from 'node:path'
import { checkoutRoot as root, withRevisionCheckout } from './revision-checkout'

const probe = join(root, 'bench', 'instructions-probe.ts')
const MODELS: [name: string, replicates: number][] = [['allele-frequency', 20_000], ['individual-based', 1]]

function instructions(engineRoot: string, model: string, replicates: number): number {
  const run = spawnSync('valgrind', [
    '--tool=cachegrind', '--cache-sim=no', '--cachegrind-out-file=/dev/null', '--smc-check=all-non-file',
    process.execPath, '--predictable', '--predictable-gc-schedule', '--hash-seed=1', '--random-seed=1', '--import', 'tsx', probe, model, String(replicates),
  ], { cwd: root, encoding: 'utf8', env: { ...process.env, ENGINE_ROOT: engineRoot, TSX_DISABLE_CACHE: '1' } })
  if (run.error) throw new Error(`valgrind could not be started (${run.error.message}); install the Debian package valgrind`)
  const match = /I\s+refs:\s+([\d,]+)/.exec(run.stderr)
  if (run.status !== 0 || !match?.[1]) throw new Error(`valgrind run failed: ${run.stderr.trim().split('\n').slice(-5).join(' | ')}`)
  return Number(match[1].replaceAll(',', ''))
}

function perReplicate(engineRoot: string, model: string, replicates: number): number {
  return (instructions(engineRoot, model, 3 * replicates) - instructions(engineRoot, model, replicates)) / (2 * replicates)
}

async function main(): Promise<void> {
  const revision = process.argv[2]
  if (!revision) throw new Error('Name the revision to compare with, e.g. npm run bench:instructions -- HEAD~3')
  await withRevisionCheckout(revision, (worktree) => {
    console.log(`Instructions per replicate (valgrind), ${revision} against this checkout`)
    for (const [model, replicates] of MODELS) {
      const old = perReplicate(worktree, model, replicates)
      const current = perReplicate(root, model, replicates)
      console.log(`${model}: ${revision} ${(old / 1e6).toFixed(3)} M, this checkout ${(current / 1e6).toFixed(3)} M; old / new ${(old / current).toFixed(3)}×`)
    }
  })
}

await main()

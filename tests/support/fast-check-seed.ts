/**
 * Property tests (fast-check) draw their cases from one fixed seed, so that a run of the suite is
 * repeatable: CI and a contributor check the same cases, and a failure comes back on the next run.
 * A property that passes its own `seed` keeps it. To try new cases, set TRIBUTARY_FC_SEED, e.g.
 * `TRIBUTARY_FC_SEED=$RANDOM npm test -- --project unit`; fast-check prints the seed and path of
 * any counterexample it finds.
 */
import fc from 'fast-check'

const seed = Number.parseInt(process.env.TRIBUTARY_FC_SEED ?? '', 10)
fc.configureGlobal({ seed: Number.isFinite(seed) ? seed : 20_261_203 })

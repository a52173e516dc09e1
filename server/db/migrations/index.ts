/**
 * Every migration, in the order it runs. Listed explicitly (not found by a glob) so the list
 * survives bundling. To add one: create `NNNN-what-it-does.ts` exporting `up` and `down`
 * (each taking `{ context }`, see ./context.ts), and append it here. Never edit or reorder a
 * migration that has shipped.
 */
import type { MigrationStep } from './context'
import * as foundation from './0001-foundation'
import * as workingNeProvenance from './0003-working-ne-provenance'
import * as proposalVersions from './0005-proposal-versions'
import * as review from './0007-review'
import * as issuedBriefs from './0006-issued-briefs'
import * as simulationRuns from './0008-simulation-runs'
import * as dataVersion from './0009-data-version'

export const migrations: MigrationStep[] = [
  { name: '0001-foundation', ...foundation },
  { name: '0003-working-ne-provenance', ...workingNeProvenance },
  { name: '0005-proposal-versions', ...proposalVersions },
  { name: '0006-issued-briefs', ...issuedBriefs },
  { name: '0007-review', ...review },
  { name: '0008-simulation-runs', ...simulationRuns },
  { name: '0009-data-version', ...dataVersion },
]

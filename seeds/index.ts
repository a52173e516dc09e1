/**
 * Every seed, in the order it runs (explicit list, like server/db/migrations/index.ts).
 * Run with `npm run db:seed` (scripts/db-seed.ts) or `runSeeds` from server/db/seed.ts.
 */
import type { MigrationStep } from '../server/db/migrations/context'
import * as demoEasternUplands from './0001-demo-eastern-uplands'
import * as demoGenotypes from './0002-demo-genotypes'
import * as demoDraftProposal from './0005-demo-draft-proposal'
import * as demoApprovedProposal from './0007-demo-approved-proposal'
import * as demoSigningCertificate from './0006-demo-signing-certificate'

export const seeds: MigrationStep[] = [
  { name: '0001-demo-eastern-uplands', ...demoEasternUplands },
  { name: '0002-demo-genotypes', ...demoGenotypes },
  { name: '0005-demo-draft-proposal', ...demoDraftProposal },
  { name: '0006-demo-signing-certificate', ...demoSigningCertificate },
  { name: '0007-demo-approved-proposal', ...demoApprovedProposal },
]

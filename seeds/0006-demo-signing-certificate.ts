/**
 * Set-up step: every agency without a brief-signing certificate gets a self-signed one
 * (server/utils/certificates.ts), so the local demo can sign briefs on approval from the start.
 * The PKCS#12 is stored encrypted under NUXT_SIGNING_PASSPHRASE (or the documented local-demo
 * default when it is not set). Administrators can upload their agency's own certificate later.
 *
 * Idempotent: recorded in `tributary_seeds`, and an agency that already has a certificate is
 * left alone.
 */
import { QueryTypes } from 'sequelize'
import type { MigrationContext } from '../server/db/migrations/context'
import { ensureAgencyCredential } from '../server/utils/certificates'

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const agencies = await sequelize.query<{ id: number, name: string, contact_email: string | null }>(
    `SELECT a.id, a.name, a.contact_email FROM agencies a
      WHERE NOT EXISTS (SELECT 1 FROM agency_signing_certificates c WHERE c.agency_id = a.id)
      ORDER BY a.id`,
    { type: QueryTypes.SELECT, transaction },
  )
  for (const agency of agencies) {
    await ensureAgencyCredential(sequelize, { id: agency.id, name: agency.name, contactEmail: agency.contact_email }, transaction)
  }
}

/** Certificates are kept: briefs already signed name them, and a new one is made on demand. */
export async function down(): Promise<void> {}

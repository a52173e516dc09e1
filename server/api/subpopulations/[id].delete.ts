/**
 * DELETE /api/subpopulations/:id?version=N → 200 { message }.
 * Removes the record with its census rows and effective-size estimates. Refused with 409 and
 * the reason when proposals name it (as recipient or source), when files or genotype data are
 * attached (remove those first, so no stored file is orphaned), when any other record still
 * refers to it (the database's foreign keys decide), or when `version` is not the current one. 404 for another agency's record. Biologists, managers and administrators.
 */
import { SubpopulationDeleteQuerySchema } from '#shared/schemas/subpopulation'
import { ATLAS_WRITERS, ownSubpopulation, referencesTo } from '../../atlas/records'
import { subpopulationAuditSnapshot } from '../../atlas/subpopulation-dto'

function listTitles(titles: readonly string[]): string {
  const quoted = titles.slice(0, 3).map(title => `"${title}"`)
  const more = titles.length > 3 ? ` and ${titles.length - 3} more` : ''
  return `${quoted.join(', ')}${more}`
}

export default defineEventHandler(async (event): Promise<{ message: string }> => {
  const user = await requireRole(event, ...ATLAS_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { version } = getQueryWith(event, SubpopulationDeleteQuerySchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (transaction) => {
    const row = await ownSubpopulation(models, user.agencyId, id, transaction)
    if (row.version !== version) {
      throw conflict(`Someone else saved "${row.name}" since you loaded it (you had version ${version}, it is now ${row.version}). Reload and check before deleting.`)
    }
    const references = await referencesTo(sequelize, row.id, transaction)
    if (references.proposals.length) {
      const count = references.proposals.length
      throw conflict(`"${row.name}" cannot be deleted: ${count === 1 ? 'a proposal names it' : `${count} proposals name it`} (${listTitles(references.proposals.map(p => p.title))}). Proposals keep their recipient and sources for the record; change or withdraw them instead.`)
    }
    if (references.attachments || references.geneticDatasets) {
      const parts = [
        references.attachments ? `${references.attachments} attached ${references.attachments === 1 ? 'file' : 'files'}` : '',
        references.geneticDatasets ? `${references.geneticDatasets} genotype ${references.geneticDatasets === 1 ? 'file' : 'files'}` : '',
      ].filter(Boolean).join(' and ')
      throw conflict(`"${row.name}" cannot be deleted while it has ${parts}. Remove them on its record page first.`)
    }
    const before = subpopulationAuditSnapshot(row)
    try {
      await row.destroy({ transaction })
    } catch (error) {
      // The whole transaction rolls back; the answer says why.
      if ((error as { name?: string }).name === 'SequelizeForeignKeyConstraintError') {
        throw conflict(`"${row.name}" cannot be deleted: other records still refer to it (such as translocations or monitoring recorded for a proposal).`)
      }
      throw error
    }
    await recordAudit(transaction, {
      agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.delete',
      entityType: 'subpopulation', entityId: id, before, after: null,
    })
    return { message: `"${before.name as string}" was deleted with its census and effective-size records.` }
  })
})

/**
 * GET /api/proposals?status=&recipientId=&mine=true → 200 { items: ProposalSummaryDto[] }
 * (newest change first). The caller's agency only; every signed-in role may read.
 */
import { Op, type WhereOptions } from 'sequelize'
import { ProposalListQuerySchema, type ProposalListResponse } from '#shared/schemas/proposal'
import type { Proposal } from '../../db/models'
import { proposalStatusEditable } from '../../utils/proposal-dto'

export default defineEventHandler(async (event): Promise<ProposalListResponse> => {
  const user = await requireUser(event)
  const query = getQueryWith(event, ProposalListQuerySchema)
  const { models, sequelize } = await useDb()

  const where: WhereOptions<Proposal> = { ...agencyScope(user) }
  if (query.status) Object.assign(where, { status: query.status })
  if (query.recipientId !== undefined) Object.assign(where, { recipientId: query.recipientId })
  if (query.mine) Object.assign(where, { authorId: user.id })

  const rows = await models.Proposal.findAll({
    where,
    include: [
      { model: models.Subpopulation, as: 'recipient', attributes: ['id', 'name'] },
      { model: models.User, as: 'author', attributes: ['id', 'name'] },
    ],
    order: [['updatedAt', 'DESC'], ['id', 'DESC']],
  })
  const ids = rows.map(row => row.id)
  const counts = ids.length === 0
    ? []
    : await models.Scenario.findAll({
      where: { proposalId: { [Op.in]: ids } },
      attributes: ['proposalId', [sequelize.fn('count', sequelize.col('id')), 'count']],
      group: ['proposalId'],
      raw: true,
    }) as unknown as { proposalId: number, count: string }[]
  const countOf = new Map(counts.map(row => [Number(row.proposalId), Number(row.count)]))

  return {
    items: rows.map(row => ({
      id: row.id,
      title: row.title,
      status: row.status,
      recipient: { id: row.recipientId, name: row.recipient?.name ?? '' },
      sourceSubpopulationIds: [...(row.sourceSubpopulationIds ?? [])],
      captiveSource: row.captiveSource ?? null,
      author: { id: row.authorId, name: row.author?.name ?? 'Former user' },
      scenarioCount: countOf.get(row.id) ?? 0,
      createdAt: row.createdAt.toISOString(),
      updatedAt: row.updatedAt.toISOString(),
      version: row.version,
      editable: proposalStatusEditable(row.status),
    })),
  }
})

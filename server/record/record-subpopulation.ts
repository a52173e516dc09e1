/**
 * The subpopulation a record route works on, found inside the caller's agency: another agency's
 * record, or one that does not exist, answers 404 (never 403). Used by the census,
 * effective-size and working-Ne routes (server/api/subpopulations/[id]/**).
 */
import type { Transaction } from 'sequelize'
import type { Subpopulation } from '../db/models'
import { useDb } from '../utils/db'
import { notFound } from '../utils/http-errors'

/**
 * Loads subpopulation `id` of the user's agency.
 *
 * @param user - the signed-in user (only `agencyId` is read)
 * @param id - subpopulation id from the route
 * @param options.transaction - run inside this transaction
 * @param options.lock - take a row lock (FOR UPDATE) to serialise writers of the same record
 * @throws 404 "Subpopulation not found." when there is no such record in the agency
 */
export async function findRecordSubpopulation(
  user: { agencyId: number },
  id: number,
  options: { transaction?: Transaction, lock?: boolean } = {},
): Promise<Subpopulation> {
  const { models } = await useDb()
  const subpopulation = await models.Subpopulation.findOne({
    where: { id, agencyId: user.agencyId },
    transaction: options.transaction,
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
  })
  if (!subpopulation) throw notFound('Subpopulation')
  return subpopulation
}

/** Roles that may change a subpopulation's record; viewers read only. */
export const RECORD_WRITERS = ['biologist', 'manager', 'administrator'] as const

/**
 * Who may do what with simulation runs, and finding them inside the caller's agency:
 *   - every signed-in role reads its agency's runs; biologists, managers and administrators
 *     start and cancel them (viewers read only, as with proposals);
 *   - a run of another agency, or one that does not exist, answers 404 (never 403).
 */
import type { Transaction } from 'sequelize'
import type { SimulationRun } from '../db/models'
import type { SimulationRunPersonDto } from '../../shared/schemas/simulation-run'
import { useDb } from '../utils/db'
import { notFound } from '../utils/http-errors'

/** Roles that may start and cancel runs. */
export const RUN_STARTERS = ['biologist', 'manager', 'administrator'] as const

/**
 * Run `id` of the caller's agency.
 *
 * @param options.transaction - read inside this transaction; options.lock - FOR UPDATE
 * @throws 404 "Simulation run not found." otherwise
 */
export async function findAgencyRun(user: { agencyId: number }, id: number, options: { transaction?: Transaction, lock?: boolean } = {}): Promise<SimulationRun> {
  const { models } = await useDb()
  const run = await models.SimulationRun.findOne({
    where: { id, agencyId: user.agencyId },
    transaction: options.transaction,
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
  })
  if (!run) throw notFound('Simulation run')
  return run
}

/** id → { id, name } of the users who requested these runs. */
export async function requesters(runs: readonly SimulationRun[], transaction?: Transaction): Promise<Map<number, SimulationRunPersonDto>> {
  const ids = [...new Set(runs.map(run => run.requestedBy).filter((id): id is number => id !== null))]
  if (ids.length === 0) return new Map()
  const { models } = await useDb()
  const users = await models.User.findAll({ where: { id: ids }, attributes: ['id', 'name'], transaction })
  return new Map(users.map(user => [user.id, { id: user.id, name: user.name }]))
}

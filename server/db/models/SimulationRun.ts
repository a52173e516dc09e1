/**
 * One run of the stochastic forward simulation (migration 0008): queued by POST /api/runs,
 * carried out by the worker process, stored with its model, parameters, seed, replicates and
 * engine version so it can be reproduced exactly. Table `simulation_runs`.
 *
 * The worker writes progress, heartbeat and result with plain SQL (worker/run-store.ts), each
 * write guarded by the run's `attempts` so a worker that lost the run cannot overwrite it; the
 * app reads through this model and writes only the cancel (with `version`).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { SIMULATION_MODELS, SIMULATION_RUN_STATUSES, type SimulationModel, type SimulationRunStatus } from '../../../shared/schemas/simulation-run'
import type { Proposal } from './Proposal'
import type { User } from './User'

export class SimulationRun extends Model<InferAttributes<SimulationRun>, InferCreationAttributes<SimulationRun>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare proposalId: number | null
  declare scenarioId: number | null
  declare model: SimulationModel
  declare parameters: Record<string, unknown>
  /** Unsigned 32-bit seed (bigint column; read back as a number). */
  declare seed: number
  declare replicates: number
  declare engineVersion: string
  declare status: CreationOptional<SimulationRunStatus>
  declare progress: CreationOptional<number>
  declare result: CreationOptional<Record<string, unknown> | null>
  declare error: CreationOptional<string | null>
  declare jobId: CreationOptional<string | null>
  declare attempts: CreationOptional<number>
  declare heartbeatAt: CreationOptional<Date | null>
  declare worker: CreationOptional<string | null>
  declare requestedBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare startedAt: CreationOptional<Date | null>
  declare finishedAt: CreationOptional<Date | null>
  declare version: CreationOptional<number>

  declare proposal?: NonAttribute<Proposal>
  declare requester?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof SimulationRun {
    SimulationRun.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      proposalId: { type: DataTypes.INTEGER, allowNull: true },
      scenarioId: { type: DataTypes.INTEGER, allowNull: true },
      model: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...SIMULATION_MODELS]] } },
      parameters: { type: DataTypes.JSONB, allowNull: false },
      seed: {
        type: DataTypes.BIGINT,
        allowNull: false,
        // pg returns bigint as text; seeds are below 2³², exact as numbers.
        get(this: SimulationRun) {
          const raw = this.getDataValue('seed') as unknown
          return raw === null || raw === undefined ? raw as unknown as number : Number(raw)
        },
      },
      replicates: { type: DataTypes.INTEGER, allowNull: false },
      engineVersion: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued', validate: { isIn: [[...SIMULATION_RUN_STATUSES]] } },
      progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      result: { type: DataTypes.JSONB, allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      jobId: { type: DataTypes.UUID, allowNull: true },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      heartbeatAt: { type: DataTypes.DATE, allowNull: true },
      worker: { type: DataTypes.TEXT, allowNull: true },
      requestedBy: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      startedAt: { type: DataTypes.DATE, allowNull: true },
      finishedAt: { type: DataTypes.DATE, allowNull: true },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'SimulationRun', tableName: 'simulation_runs', underscored: true, version: true })
    return SimulationRun
  }
}

/**
 * Umzug storage that records executed steps in a PostgreSQL table through the runner's
 * transaction, so the record and the schema change commit (or roll back) together, and
 * concurrent runners see each other's work only after the advisory lock is released.
 *
 * umzug's own SequelizeStorage runs outside any transaction and creates its table with
 * `Model.sync()`; this one keeps the same shape (a Sequelize model named after the table,
 * one `name` column) but passes the transaction to every query and creates the table with
 * plain SQL.
 */
import { DataTypes, type Model, type ModelStatic, type Sequelize, type Transaction } from 'sequelize'
import type { UmzugStorage } from 'umzug'

interface StepRecord extends Model {
  name: string
}

export class TransactionalStorage implements UmzugStorage {
  private readonly sequelize: Sequelize
  private readonly table: string
  private readonly transaction: Transaction
  private readonly model: ModelStatic<StepRecord>

  /**
   * @param sequelize - the connection the transaction belongs to
   * @param table - storage table and model name (e.g. 'tributary_migrations'); one of our
   *   own constants, never user input
   * @param transaction - the runner's transaction
   */
  constructor(sequelize: Sequelize, table: string, transaction: Transaction) {
    this.sequelize = sequelize
    this.table = table
    this.transaction = transaction
    this.model = sequelize.isDefined(table)
      ? sequelize.model(table) as ModelStatic<StepRecord>
      : sequelize.define<StepRecord>(table, {
          name: { type: DataTypes.STRING(255), allowNull: false, primaryKey: true },
        }, { tableName: table, timestamps: false })
  }

  private async ensureTable(): Promise<void> {
    await this.sequelize.query(
      `CREATE TABLE IF NOT EXISTS "${this.table}" (name varchar(255) PRIMARY KEY)`,
      { transaction: this.transaction },
    )
  }

  async logMigration({ name }: { name: string }): Promise<void> {
    await this.ensureTable()
    await this.model.create({ name }, { transaction: this.transaction })
  }

  async unlogMigration({ name }: { name: string }): Promise<void> {
    await this.ensureTable()
    await this.model.destroy({ where: { name }, transaction: this.transaction })
  }

  async executed(): Promise<string[]> {
    await this.ensureTable()
    const rows = await this.model.findAll({ order: [['name', 'ASC']], transaction: this.transaction })
    return rows.map(row => row.name)
  }
}

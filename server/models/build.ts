import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BuildMove, BuildStatus } from '../../shared/api/builds.js';

/**
 * A build: boards to make, each carrying several saved matches. `planned` holds no stock,
 * `reserved` holds it (reservations), `built` consumed it, `cancelled` released it.
 */
export class Build extends Model<InferAttributes<Build>, InferCreationAttributes<Build>> {
  declare id: CreationOptional<number>;
  declare name: string;
  /** Boards. */
  declare quantity: number;
  declare status: BuildStatus;
  declare createdBy: number | null;
  /** Elements the allocation moved to their next-best part when the build was reserved. */
  declare moves: CreationOptional<BuildMove[]>;
  declare reservedAt: Date | null;
  declare builtAt: Date | null;
  declare cancelledAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Build.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true, field: 'created_by' },
        moves: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        reservedAt: { type: DataTypes.DATE, allowNull: true, field: 'reserved_at' },
        builtAt: { type: DataTypes.DATE, allowNull: true, field: 'built_at' },
        cancelledAt: { type: DataTypes.DATE, allowNull: true, field: 'cancelled_at' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
        updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
      },
      { sequelize, tableName: 'builds', underscored: true },
    );
  }
}

import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ShortfallReason, ShortfallSource } from '../../shared/api/builds.js';
import type { PartKind } from '../../shared/engine/part-kind.js';

/** One line of a shortfall list: a part to buy, to a spec (values SI: F or H, Hz, dB). */
export class ShortfallLine extends Model<InferAttributes<ShortfallLine>, InferCreationAttributes<ShortfallLine>> {
  declare id: CreationOptional<number>;
  declare listId: number;
  declare ordinal: number;
  declare kind: PartKind;
  declare idealValue: number;
  declare buyValue: number;
  declare series: string;
  /** To buy, with the attrition allowance. */
  declare quantity: number;
  declare shortQuantity: number;
  declare minSrfHz: number;
  declare toleranceKind: 'relative' | 'absolute';
  /** A fraction (relative) or F/H (absolute). */
  declare toleranceValue: number;
  declare toleranceCode: string;
  declare toleranceWithinBudget: boolean;
  declare package: string | null;
  declare reason: ShortfallReason;
  declare reasonText: string;
  declare buyLossDb: number | null;
  declare sources: ShortfallSource[];
  declare receivedQuantity: CreationOptional<number>;

  static initModel(sequelize: Sequelize): void {
    ShortfallLine.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        listId: { type: DataTypes.INTEGER, allowNull: false, field: 'list_id' },
        ordinal: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        idealValue: { type: DataTypes.DOUBLE, allowNull: false, field: 'ideal_value' },
        buyValue: { type: DataTypes.DOUBLE, allowNull: false, field: 'buy_value' },
        series: { type: DataTypes.STRING(4), allowNull: false },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        shortQuantity: { type: DataTypes.INTEGER, allowNull: false, field: 'short_quantity' },
        minSrfHz: { type: DataTypes.DOUBLE, allowNull: false, field: 'min_srf_hz' },
        toleranceKind: { type: DataTypes.STRING(8), allowNull: false, field: 'tolerance_kind' },
        toleranceValue: { type: DataTypes.DOUBLE, allowNull: false, field: 'tolerance_value' },
        toleranceCode: { type: DataTypes.STRING(8), allowNull: false, field: 'tolerance_code' },
        toleranceWithinBudget: { type: DataTypes.BOOLEAN, allowNull: false, field: 'tolerance_within_budget' },
        package: { type: DataTypes.STRING(16), allowNull: true },
        reason: { type: DataTypes.STRING(16), allowNull: false },
        reasonText: { type: DataTypes.TEXT, allowNull: false, field: 'reason_text' },
        buyLossDb: { type: DataTypes.DOUBLE, allowNull: true, field: 'buy_loss_db' },
        sources: { type: DataTypes.JSONB, allowNull: false },
        receivedQuantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, field: 'received_quantity' },
      },
      { sequelize, tableName: 'shortfall_lines', underscored: true, timestamps: false },
    );
  }
}

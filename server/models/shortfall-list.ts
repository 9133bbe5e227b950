import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ShortfallStatus } from '../../shared/api/builds.js';

/** One receipt: parts that arrived, and the stock import they entered stock through. */
export interface ShortfallReceipt {
  importId: number;
  userId: number | null;
  /** ISO 8601. */
  at: string;
  lines: { lineId: number; quantity: number; partNumber: string; location: string }[];
}

/**
 * The shortfall list of a build (one per build): what purchasing must buy, with the settings it was
 * computed with, its status (draft, sent, ordered, received), where it was last e-mailed and the
 * receipts that brought parts into stock.
 */
export class ShortfallList extends Model<InferAttributes<ShortfallList>, InferCreationAttributes<ShortfallList>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare status: ShortfallStatus;
  declare attritionPercent: number;
  declare lossBudgetDb: number;
  declare usableSrfFraction: number;
  declare sentTo: string | null;
  declare sentAt: Date | null;
  declare lastMailId: number | null;
  declare receipts: CreationOptional<ShortfallReceipt[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ShortfallList.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        buildId: { type: DataTypes.INTEGER, allowNull: false, field: 'build_id' },
        status: { type: DataTypes.STRING(16), allowNull: false },
        attritionPercent: { type: DataTypes.DOUBLE, allowNull: false, field: 'attrition_percent' },
        lossBudgetDb: { type: DataTypes.DOUBLE, allowNull: false, field: 'loss_budget_db' },
        usableSrfFraction: { type: DataTypes.DOUBLE, allowNull: false, field: 'usable_srf_fraction' },
        sentTo: { type: DataTypes.TEXT, allowNull: true, field: 'sent_to' },
        sentAt: { type: DataTypes.DATE, allowNull: true, field: 'sent_at' },
        lastMailId: { type: DataTypes.BIGINT, allowNull: true, field: 'last_mail_id' },
        receipts: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
        updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
      },
      { sequelize, tableName: 'shortfall_lists', underscored: true },
    );
  }
}

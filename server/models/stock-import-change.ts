import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PartChangeKind } from '../../shared/api/stock.js';

/**
 * What one import did to one part: created, updated or zeroed, the quantity before and after, and
 * the other fields that changed (`before`/`after` hold only those, by their API names).
 * Parts the import left as they were get no row; an import has at most one row per part.
 */
export class StockImportChange extends Model<InferAttributes<StockImportChange>, InferCreationAttributes<StockImportChange>> {
  declare importId: number;
  declare partId: number;
  declare change: PartChangeKind;
  declare quantityBefore: number | null;
  declare quantityAfter: number;
  declare before: Record<string, unknown> | null;
  declare after: Record<string, unknown> | null;

  static initModel(sequelize: Sequelize): void {
    StockImportChange.init(
      {
        importId: { type: DataTypes.BIGINT, allowNull: false, primaryKey: true, field: 'import_id' },
        partId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, field: 'part_id' },
        change: { type: DataTypes.STRING(8), allowNull: false },
        quantityBefore: { type: DataTypes.INTEGER, allowNull: true, field: 'quantity_before' },
        quantityAfter: { type: DataTypes.INTEGER, allowNull: false, field: 'quantity_after' },
        before: { type: DataTypes.JSONB, allowNull: true },
        after: { type: DataTypes.JSONB, allowNull: true },
      },
      { sequelize, tableName: 'stock_import_changes', underscored: true, timestamps: false },
    );
  }
}

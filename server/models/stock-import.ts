import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { StockFileProblem, StockImportMode, StockImportStatus } from '../../shared/api/stock.js';

/**
 * One upload of a stock-list file: who, when, which bytes (SHA-256), how (mode), what came of it
 * (counts), and its problems. Applied and refused uploads are both kept; dry runs are not.
 */
export class StockImport extends Model<InferAttributes<StockImport>, InferCreationAttributes<StockImport>> {
  declare id: CreationOptional<number>;
  declare userId: number | null;
  declare status: StockImportStatus;
  declare fileName: string;
  declare sha256: string;
  declare sizeBytes: number;
  declare mode: StockImportMode;
  declare skipInvalid: boolean;
  declare rowsRead: number;
  declare createdCount: number;
  declare updatedCount: number;
  declare unchangedCount: number;
  declare zeroedCount: number;
  declare rejectedCount: number;
  declare warningCount: number;
  declare locations: string[];
  /** The first rejected rows and warnings (up to a cap; the counts are exact). */
  declare problems: { rejected: StockFileProblem[]; warnings: StockFileProblem[]; truncated: boolean };
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    StockImport.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        userId: { type: DataTypes.INTEGER, allowNull: true, field: 'user_id' },
        status: { type: DataTypes.STRING(16), allowNull: false },
        fileName: { type: DataTypes.STRING(255), allowNull: false, field: 'file_name' },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false, field: 'size_bytes' },
        mode: { type: DataTypes.STRING(8), allowNull: false },
        skipInvalid: { type: DataTypes.BOOLEAN, allowNull: false, field: 'skip_invalid' },
        rowsRead: { type: DataTypes.INTEGER, allowNull: false, field: 'rows_read' },
        createdCount: { type: DataTypes.INTEGER, allowNull: false, field: 'created_count' },
        updatedCount: { type: DataTypes.INTEGER, allowNull: false, field: 'updated_count' },
        unchangedCount: { type: DataTypes.INTEGER, allowNull: false, field: 'unchanged_count' },
        zeroedCount: { type: DataTypes.INTEGER, allowNull: false, field: 'zeroed_count' },
        rejectedCount: { type: DataTypes.INTEGER, allowNull: false, field: 'rejected_count' },
        warningCount: { type: DataTypes.INTEGER, allowNull: false, field: 'warning_count' },
        locations: { type: DataTypes.ARRAY(DataTypes.STRING(64)), allowNull: false },
        problems: { type: DataTypes.JSONB, allowNull: false },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
      },
      { sequelize, tableName: 'stock_imports', underscored: true, updatedAt: false },
    );
  }
}

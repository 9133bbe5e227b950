import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PartKind } from '../../shared/api/stock.js';

/**
 * One stocked capacitor or inductor at one location (handbook stock-csv.md). Values are SI: farads or
 * henries, hertz, ohms, volts, amperes. Parts are never deleted (builds and history refer to them);
 * a part that is gone has quantity 0.
 */
export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
  declare id: CreationOptional<number>;
  /** Stores' stock code; unique within a location. */
  declare partNumber: string;
  declare location: string;
  declare kind: PartKind;
  /** Nominal value in F or H. */
  declare valueSi: number;
  /** `relative`: `toleranceValue` is a fraction (0.05 = 5 %); `absolute`: in F or H. */
  declare toleranceKind: 'relative' | 'absolute';
  declare toleranceValue: number;
  declare srfHz: number | null;
  declare q: number | null;
  declare qFrequencyHz: number | null;
  declare esrOhm: number | null;
  /** On hand. */
  declare quantity: number;
  /** Held for builds (the builds work keeps it); `available = quantity - reserved`. */
  declare reserved: CreationOptional<number>;
  declare package: string | null;
  declare voltageRatingV: number | null;
  declare currentRatingA: number | null;
  declare series: string | null;
  /** DECIMAL(12,4), read as a string so money never passes through a float. */
  declare unitCost: string | null;
  declare manufacturerPart: string | null;
  declare description: string | null;
  /** The import that last created or changed the part. */
  declare lastImportId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Part.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        partNumber: { type: DataTypes.STRING(64), allowNull: false, field: 'part_number' },
        location: { type: DataTypes.STRING(64), allowNull: false },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        valueSi: { type: DataTypes.DOUBLE, allowNull: false, field: 'value_si' },
        toleranceKind: { type: DataTypes.STRING(8), allowNull: false, field: 'tolerance_kind' },
        toleranceValue: { type: DataTypes.DOUBLE, allowNull: false, field: 'tolerance_value' },
        srfHz: { type: DataTypes.DOUBLE, allowNull: true, field: 'srf_hz' },
        q: { type: DataTypes.DOUBLE, allowNull: true },
        qFrequencyHz: { type: DataTypes.DOUBLE, allowNull: true, field: 'q_frequency_hz' },
        esrOhm: { type: DataTypes.DOUBLE, allowNull: true, field: 'esr_ohm' },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        reserved: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        package: { type: DataTypes.STRING(16), allowNull: true },
        voltageRatingV: { type: DataTypes.DOUBLE, allowNull: true, field: 'voltage_rating_v' },
        currentRatingA: { type: DataTypes.DOUBLE, allowNull: true, field: 'current_rating_a' },
        series: { type: DataTypes.STRING(4), allowNull: true },
        unitCost: { type: DataTypes.DECIMAL(12, 4), allowNull: true, field: 'unit_cost' },
        manufacturerPart: { type: DataTypes.STRING(100), allowNull: true, field: 'manufacturer_part' },
        description: { type: DataTypes.STRING(500), allowNull: true },
        lastImportId: { type: DataTypes.BIGINT, allowNull: true, field: 'last_import_id' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
        updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
      },
      { sequelize, tableName: 'parts', underscored: true },
    );
  }
}

import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Objective } from '../../shared/api/matches.js';
import type { PreferredSeries } from '../../shared/api/settings.js';

/** The organisation settings: one row, id 1 (shared/api/settings.ts explains each). */
export class OrganisationSetting extends Model<InferAttributes<OrganisationSetting>, InferCreationAttributes<OrganisationSetting>> {
  declare id: CreationOptional<number>;
  declare usableSrfFraction: number;
  declare excludeAboveLimit: boolean;
  declare defaultObjective: Objective;
  declare lossBudgetDb: number;
  declare preferredSeriesCapacitor: PreferredSeries;
  declare preferredSeriesInductor: PreferredSeries;
  declare attritionPercent: number;
  declare updatedBy: number | null;
  declare updatedAt: Date | null;

  static initModel(sequelize: Sequelize): void {
    OrganisationSetting.init(
      {
        id: { type: DataTypes.SMALLINT, primaryKey: true, defaultValue: 1 },
        usableSrfFraction: { type: DataTypes.DOUBLE, allowNull: false, field: 'usable_srf_fraction' },
        excludeAboveLimit: { type: DataTypes.BOOLEAN, allowNull: false, field: 'exclude_above_limit' },
        defaultObjective: { type: DataTypes.STRING(16), allowNull: false, field: 'default_objective' },
        lossBudgetDb: { type: DataTypes.DOUBLE, allowNull: false, field: 'loss_budget_db' },
        preferredSeriesCapacitor: { type: DataTypes.STRING(4), allowNull: false, field: 'preferred_series_capacitor' },
        preferredSeriesInductor: { type: DataTypes.STRING(4), allowNull: false, field: 'preferred_series_inductor' },
        attritionPercent: { type: DataTypes.DOUBLE, allowNull: false, field: 'attrition_percent' },
        updatedBy: { type: DataTypes.INTEGER, allowNull: true, field: 'updated_by' },
        updatedAt: { type: DataTypes.DATE, allowNull: true, field: 'updated_at' },
      },
      { sequelize, tableName: 'organisation_settings', timestamps: false },
    );
  }
}

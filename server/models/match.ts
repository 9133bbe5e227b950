import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MatchNetwork, NetworkPlacement, Objective, SolveRequest } from '../../shared/api/matches.js';
import type { SnappedFit } from '../../shared/snapping/snapped-fit.js';
import type { SnapPart } from '../../shared/snapping/snap-part.js';

/** The settings a saved match was ranked and judged with. */
export interface MatchSettingsSnapshot {
  usableSrfFraction: number;
  excludeAboveLimit: boolean;
  lossBudgetDb: number;
}

/**
 * A saved match (api.md `POST /api/matches`): its request, the chosen fit with its results, and a
 * snapshot of the parts that fit uses, so it reopens with the same numbers after the stock changes.
 */
export class Match extends Model<InferAttributes<Match>, InferCreationAttributes<Match>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare createdBy: number | null;
  /** The solve request as the client sent it. */
  declare request: SolveRequest;
  declare placement: NetworkPlacement;
  declare solution: 1 | 2;
  declare rank: number;
  declare objective: Objective;
  /** The chosen fit with its losses, TPG, flags and yield, as computed when saved. */
  declare fit: SnappedFit;
  /** The ideal network the fit belongs to (without its fits). */
  declare network: Omit<MatchNetwork, 'fits'>;
  declare settings: MatchSettingsSnapshot;
  /** Every part the fit uses, as the stock list described it when saved. */
  declare parts: SnapPart[];
  declare partIds: number[];
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Match.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true, field: 'created_by' },
        request: { type: DataTypes.JSONB, allowNull: false },
        placement: { type: DataTypes.STRING(16), allowNull: false },
        solution: { type: DataTypes.SMALLINT, allowNull: false },
        rank: { type: DataTypes.INTEGER, allowNull: false },
        objective: { type: DataTypes.STRING(16), allowNull: false },
        fit: { type: DataTypes.JSONB, allowNull: false },
        network: { type: DataTypes.JSONB, allowNull: false },
        settings: { type: DataTypes.JSONB, allowNull: false },
        parts: { type: DataTypes.JSONB, allowNull: false },
        partIds: { type: DataTypes.ARRAY(DataTypes.INTEGER), allowNull: false, field: 'part_ids' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
      },
      { sequelize, tableName: 'matches', underscored: true, updatedAt: false },
    );
  }
}

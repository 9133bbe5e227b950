import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Complex } from '../../shared/engine/complex.js';
import type { Arrangement, PartKind, Position } from '../../shared/engine/part-kind.js';

/** One element of a planned match: its ideal value and the stocked parts the chosen fit uses. */
export interface PlannedElement {
  position: Position;
  kind: PartKind;
  /** Ideal value at f0, F or H. */
  idealValue: number;
  arrangement: Arrangement;
  /**
   * Parts by stock code, with how many of each one board needs for this element, and the part row
   * and location the match chose when it knows them (a stock code is unique only within a location).
   */
  parts: { partNumber: string; perBoard: number; partId?: number; location?: string }[];
}

/** The design of a saved match as the build planned it (a snapshot: the match may change later). */
export interface PlannedMatchDesign {
  /** Source and load impedance at f0, ohm. */
  source: Complex;
  load: Complex;
  frequencyHz: number;
  /** Elements from the source to the load. */
  elements: PlannedElement[];
  /** The location the match searched, or null for all. */
  location: string | null;
  /** The match request's overrides of the organisation settings, or null. */
  usableSrfFraction: number | null;
  excludeAboveLimit: boolean | null;
}

/** A saved match one board of a build carries, in the order the build lists them. */
export class BuildMatch extends Model<InferAttributes<BuildMatch>, InferCreationAttributes<BuildMatch>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare matchId: number;
  declare ordinal: number;
  declare matchName: string;
  declare design: PlannedMatchDesign;

  static initModel(sequelize: Sequelize): void {
    BuildMatch.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        buildId: { type: DataTypes.INTEGER, allowNull: false, field: 'build_id' },
        matchId: { type: DataTypes.BIGINT, allowNull: false, field: 'match_id' },
        ordinal: { type: DataTypes.INTEGER, allowNull: false },
        matchName: { type: DataTypes.STRING(200), allowNull: false, field: 'match_name' },
        design: { type: DataTypes.JSONB, allowNull: false },
      },
      { sequelize, tableName: 'build_matches', underscored: true, timestamps: false },
    );
  }
}

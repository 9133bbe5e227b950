import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PartKind, Position } from '../../shared/engine/part-kind.js';

/** `held` counts in `parts.reserved`; `consumed` left stock when the build was built; `released` went back. */
export type ReservationState = 'held' | 'consumed' | 'released';

/**
 * One part of one element of one match of a build: how many the build needs and how many are held.
 * `parts.reserved` is the sum of `quantity` over held rows of the part, kept in the same
 * transaction as every change here.
 */
export class Reservation extends Model<InferAttributes<Reservation>, InferCreationAttributes<Reservation>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare buildMatchId: number;
  declare matchId: number;
  declare elementIndex: number;
  declare position: Position;
  declare kind: PartKind;
  /** The part held; null when the element has no stocked part. */
  declare partId: number | null;
  declare partNumber: string | null;
  declare location: string | null;
  declare perBoard: number;
  /** Boards x per board. */
  declare needed: number;
  /** Held (or consumed, once built); never above `needed`. */
  declare quantity: number;
  declare state: ReservationState;
  /** The chosen fit's part numbers when the allocation moved the element to another part. */
  declare movedFrom: string[] | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Reservation.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        buildId: { type: DataTypes.INTEGER, allowNull: false, field: 'build_id' },
        buildMatchId: { type: DataTypes.INTEGER, allowNull: false, field: 'build_match_id' },
        matchId: { type: DataTypes.BIGINT, allowNull: false, field: 'match_id' },
        elementIndex: { type: DataTypes.INTEGER, allowNull: false, field: 'element_index' },
        position: { type: DataTypes.STRING(8), allowNull: false },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        partId: { type: DataTypes.INTEGER, allowNull: true, field: 'part_id' },
        partNumber: { type: DataTypes.STRING(64), allowNull: true, field: 'part_number' },
        location: { type: DataTypes.STRING(64), allowNull: true },
        perBoard: { type: DataTypes.INTEGER, allowNull: false, field: 'per_board' },
        needed: { type: DataTypes.INTEGER, allowNull: false },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        state: { type: DataTypes.STRING(10), allowNull: false },
        movedFrom: { type: DataTypes.JSONB, allowNull: true, field: 'moved_from' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
        updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
      },
      { sequelize, tableName: 'reservations', underscored: true },
    );
  }
}

import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One change someone made: who, what, to which record, and the values before and after. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  /** The user who made the change; null for the system (start command, seeding). */
  declare actorId: number | null;
  /** What was done, dotted: `user.create`, `user.update`, `stock.import`, `build.reserve`. */
  declare action: string;
  declare entityType: string;
  declare entityId: string | null;
  declare before: object | null;
  declare after: object | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditEntry.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        actorId: { type: DataTypes.INTEGER, allowNull: true, field: 'actor_id' },
        action: { type: DataTypes.STRING(64), allowNull: false },
        entityType: { type: DataTypes.STRING(32), allowNull: false, field: 'entity_type' },
        entityId: { type: DataTypes.STRING(64), allowNull: true, field: 'entity_id' },
        before: { type: DataTypes.JSONB, allowNull: true },
        after: { type: DataTypes.JSONB, allowNull: true },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
      },
      { sequelize, tableName: 'audit_entries', underscored: true, updatedAt: false },
    );
  }
}

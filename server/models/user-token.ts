import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AccountLinkPurpose } from '../../shared/api/account-links.js';

/**
 * A single-use link token that lets a user choose a password (an invitation or a password
 * reset). Only the SHA-256 hash of the token is stored; the token itself exists only in the
 * e-mail. It works until it is used, revoked (a newer link or a password change replaced it) or
 * past `expiresAt`.
 */
export class UserToken extends Model<InferAttributes<UserToken>, InferCreationAttributes<UserToken>> {
  declare id: CreationOptional<number>;
  declare userId: number;
  declare purpose: AccountLinkPurpose;
  /** Lower-case hex SHA-256 of the token string. */
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare revokedAt: Date | null;
  /** The admin who sent the link. */
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    UserToken.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        userId: { type: DataTypes.INTEGER, allowNull: false, field: 'user_id' },
        purpose: { type: DataTypes.STRING(16), allowNull: false },
        tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true, field: 'token_hash' },
        expiresAt: { type: DataTypes.DATE, allowNull: false, field: 'expires_at' },
        usedAt: { type: DataTypes.DATE, allowNull: true, field: 'used_at' },
        revokedAt: { type: DataTypes.DATE, allowNull: true, field: 'revoked_at' },
        createdBy: { type: DataTypes.INTEGER, allowNull: true, field: 'created_by' },
        createdAt: { type: DataTypes.DATE, field: 'created_at' },
      },
      { sequelize, tableName: 'user_tokens', underscored: true, updatedAt: false },
    );
  }
}

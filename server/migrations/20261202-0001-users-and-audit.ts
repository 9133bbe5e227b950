import { DataTypes, type QueryInterface } from 'sequelize';

/** Users (argon2id hashes, roles) and the audit table that records who changed what. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    password_hash: { type: DataTypes.STRING(255), allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.sequelize.query(
    "ALTER TABLE users ADD CONSTRAINT users_role_check CHECK (role IN ('admin','designer','stores','purchasing'))",
  );
  await qi.createTable('audit_entries', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    actor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    action: { type: DataTypes.STRING(64), allowNull: false },
    entity_type: { type: DataTypes.STRING(32), allowNull: false },
    entity_id: { type: DataTypes.STRING(64), allowNull: true },
    before: { type: DataTypes.JSONB, allowNull: true },
    after: { type: DataTypes.JSONB, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('audit_entries', ['entity_type', 'entity_id']);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('audit_entries');
  await qi.dropTable('users');
}

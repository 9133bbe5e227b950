import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Outgoing e-mail as the Outbox shows it (`outbound_mail`), and the single-use link tokens of
 * invitations and password resets (`user_tokens`, SHA-256 hashes only).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('outbound_mail', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    purpose: { type: DataTypes.STRING(32), allowNull: false },
    from_address: { type: DataTypes.STRING(320), allowNull: false },
    to_addresses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    subject: { type: DataTypes.STRING(400), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    status: { type: DataTypes.STRING(16), allowNull: false },
    error: { type: DataTypes.TEXT, allowNull: true },
    message_id: { type: DataTypes.STRING(400), allowNull: true },
    actor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    sent_at: { type: DataTypes.DATE, allowNull: true },
  });
  await qi.sequelize.query(
    "ALTER TABLE outbound_mail ADD CONSTRAINT outbound_mail_status_check CHECK (status IN ('sending','sent','failed'))",
  );
  await qi.addIndex('outbound_mail', ['created_at']);

  await qi.createTable('user_tokens', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.STRING(16), allowNull: false },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.sequelize.query(
    "ALTER TABLE user_tokens ADD CONSTRAINT user_tokens_purpose_check CHECK (purpose IN ('invitation','password-reset'))",
  );
  await qi.addIndex('user_tokens', ['user_id', 'purpose']);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('user_tokens');
  await qi.dropTable('outbound_mail');
}

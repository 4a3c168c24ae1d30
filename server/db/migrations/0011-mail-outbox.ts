import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * The mail outbox: every message the app sends is written here first and delivered from here
 * (server/mail/outbox.ts), so a mail server that is down delays a message instead of losing it.
 * A row is pending until `sent_at` is set; `next_attempt_at` is when a sender may try it next
 * (claimed with FOR UPDATE SKIP LOCKED, so several app instances never send one message twice at once).
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('mail_outbox', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    from_address: { type: DataTypes.TEXT, allowNull: false },
    to_address: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    next_attempt_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('mail_outbox', ['next_attempt_at'], { name: 'mail_outbox_pending', where: { sent_at: null } });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('mail_outbox');
}

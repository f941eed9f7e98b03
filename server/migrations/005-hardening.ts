import { DataTypes, type QueryInterface } from 'sequelize';

// Hardening: events counted by the mail rate limits (invitations per cruise and per sender, reset
// mails per address), and an index so sign-in back-off counts per address stay cheap.
export async function up(qi: QueryInterface) {
  await qi.createTable('rate_events', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    bucket: { type: DataTypes.TEXT, allowNull: false },
    key: { type: DataTypes.TEXT, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addIndex('rate_events', ['bucket', 'key', 'at']);
  await qi.addIndex('login_attempts', ['ip', 'at']);
}

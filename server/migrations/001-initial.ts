import { DataTypes, type QueryInterface } from 'sequelize';

// The first schema: accounts, cruises and roles, plan, intake, casts (column storage), audit.
export async function up(qi: QueryInterface) {
  const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
  const serial = { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true };
  const ts = {
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  };
  const ref = (table: string, onDelete = 'CASCADE') => ({
    type: DataTypes.UUID,
    allowNull: false,
    references: { model: table, key: 'id' },
    onDelete,
  });
  await qi.createTable('users', {
    id,
    email: { type: DataTypes.TEXT, allowNull: false, unique: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    password_hash: DataTypes.TEXT,
    is_admin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ...ts,
  });
  await qi.createTable('cruises', {
    id,
    name: { type: DataTypes.TEXT, allowNull: false },
    ship: { type: DataTypes.TEXT, allowNull: false },
    start_date: { type: DataTypes.DATEONLY, allowNull: false },
    end_date: { type: DataTypes.DATEONLY, allowNull: false },
    port_start: DataTypes.TEXT,
    port_end: DataTypes.TEXT,
    region: DataTypes.TEXT,
    description: DataTypes.TEXT,
    locked: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    created_by: { type: DataTypes.UUID, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...ts,
  });
  await qi.createTable('memberships', {
    id,
    user_id: ref('users'),
    cruise_id: ref('cruises'),
    role: { type: DataTypes.TEXT, allowNull: false },
    ...ts,
  });
  await qi.addIndex('memberships', ['user_id', 'cruise_id'], { unique: true });
  await qi.createTable('stations', {
    id,
    cruise_id: ref('cruises'),
    name: { type: DataTypes.TEXT, allowNull: false },
    latitude: { type: DataTypes.DOUBLE, allowNull: false },
    longitude: { type: DataTypes.DOUBLE, allowNull: false },
    planned_depth: DataTypes.DOUBLE,
    order: { type: DataTypes.INTEGER, allowNull: false },
    ...ts,
  });
  await qi.addIndex('stations', ['cruise_id', 'order']);
  await qi.createTable('uploads', {
    id,
    cruise_id: ref('cruises'),
    filename: { type: DataTypes.TEXT, allowNull: false },
    storage_key: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    size: { type: DataTypes.BIGINT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    errors: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    cast_ids: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    unmapped_headers: DataTypes.JSONB,
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_by: { type: DataTypes.UUID, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...ts,
  });
  await qi.addIndex('uploads', ['cruise_id', 'sha256']);
  await qi.createTable('casts', {
    id,
    cruise_id: ref('cruises'),
    upload_id: { type: DataTypes.UUID, references: { model: 'uploads', key: 'id' }, onDelete: 'SET NULL' },
    station: { type: DataTypes.TEXT, allowNull: false },
    cast: { type: DataTypes.TEXT, allowNull: false },
    latitude: { type: DataTypes.DOUBLE, allowNull: false },
    longitude: { type: DataTypes.DOUBLE, allowNull: false },
    time: DataTypes.DATE,
    bottom_depth: DataTypes.DOUBLE,
    levels: { type: DataTypes.INTEGER, allowNull: false },
    inversion_count: { type: DataTypes.INTEGER, allowNull: false },
    inversions: { type: DataTypes.JSONB, allowNull: false },
    fitness: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    metadata: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    notes: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    source_file: { type: DataTypes.TEXT, allowNull: false },
    source_sha256: { type: DataTypes.TEXT, allowNull: false },
    ...ts,
  });
  // A cast is stored once per source file content and entry: the guard against duplicates on retry.
  await qi.addIndex('casts', ['cruise_id', 'source_sha256', 'source_file'], {
    unique: true,
    name: 'casts_source_unique',
  });
  await qi.addIndex('casts', ['cruise_id', 'station', 'cast']);
  await qi.createTable('cast_columns', {
    id: serial,
    cast_id: ref('casts'),
    name: { type: DataTypes.TEXT, allowNull: false },
    unit: DataTypes.TEXT,
    kind: { type: DataTypes.TEXT, allowNull: false },
    values: { type: DataTypes.BLOB, allowNull: false },
  });
  await qi.addIndex('cast_columns', ['cast_id', 'name'], { unique: true });
  await qi.createTable('audit_entries', {
    id: serial,
    cruise_id: { type: DataTypes.UUID, references: { model: 'cruises', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.UUID, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    action: { type: DataTypes.TEXT, allowNull: false },
    entity: { type: DataTypes.TEXT, allowNull: false },
    entity_id: DataTypes.TEXT,
    before: DataTypes.JSONB,
    after: DataTypes.JSONB,
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addIndex('audit_entries', ['cruise_id', 'at']);
  await qi.createTable('invitations', {
    id,
    cruise_id: ref('cruises'),
    email: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    invited_by: ref('users'),
    expires_at: { type: DataTypes.DATE, allowNull: false },
    accepted_at: DataTypes.DATE,
    ...ts,
  });
  await qi.createTable('password_resets', {
    id,
    user_id: ref('users'),
    token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: DataTypes.DATE,
    ...ts,
  });
  await qi.createTable('login_attempts', {
    id: serial,
    email: { type: DataTypes.TEXT, allowNull: false },
    ip: { type: DataTypes.TEXT, allowNull: false },
    succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addIndex('login_attempts', ['email', 'at']);
  await qi.createTable('layer_sets', {
    id,
    cruise_id: ref('cruises'),
    name: { type: DataTypes.TEXT, allowNull: false },
    reference_pressure: { type: DataTypes.INTEGER, allowNull: false },
    levels: { type: DataTypes.TEXT, allowNull: false },
    created_by: { type: DataTypes.UUID, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...ts,
  });
  await qi.createTable('column_mappings', {
    id: serial,
    cruise_id: ref('cruises'),
    header: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    ...ts,
  });
  await qi.addIndex('column_mappings', ['cruise_id', 'header'], { unique: true });
  // Sessions (connect-pg-simple's table layout).
  await qi.sequelize
    .query(`CREATE TABLE IF NOT EXISTS "session" ("sid" varchar NOT NULL PRIMARY KEY, "sess" json NOT NULL, "expire" timestamp(6) NOT NULL);
    CREATE INDEX IF NOT EXISTS "IDX_session_expire" ON "session" ("expire");`);
}

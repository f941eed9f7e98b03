import { DataTypes, type QueryInterface } from 'sequelize';

// Derived variables, saved section views, deliveries.
export async function up(qi: QueryInterface) {
  const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
  const ts = {
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  };
  const cruise = {
    type: DataTypes.UUID,
    allowNull: false,
    references: { model: 'cruises', key: 'id' },
    onDelete: 'CASCADE',
  };
  const user = (allowNull: boolean) => ({
    type: DataTypes.UUID,
    allowNull,
    references: { model: 'users', key: 'id' },
    onDelete: allowNull ? 'SET NULL' : 'CASCADE',
  });
  await qi.createTable('derived_variables', {
    id,
    cruise_id: cruise,
    name: { type: DataTypes.TEXT, allowNull: false },
    formula: { type: DataTypes.TEXT, allowNull: false },
    unit: DataTypes.TEXT,
    description: DataTypes.TEXT,
    created_by: user(true),
    ...ts,
  });
  await qi.addIndex('derived_variables', ['cruise_id', 'name'], { unique: true });
  await qi.createTable('saved_views', {
    id,
    cruise_id: cruise,
    user_id: user(false),
    name: { type: DataTypes.TEXT, allowNull: false },
    query: { type: DataTypes.TEXT, allowNull: false },
    ...ts,
  });
  await qi.createTable('deliveries', {
    id,
    cruise_id: cruise,
    kind: { type: DataTypes.TEXT, allowNull: false },
    params: { type: DataTypes.JSONB, allowNull: false },
    formats: { type: DataTypes.JSONB, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    files: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    error: DataTypes.TEXT,
    released: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    released_at: DataTypes.DATE,
    released_by: user(true),
    created_by: user(true),
    ...ts,
  });
  await qi.addIndex('deliveries', ['cruise_id', 'created_at']);
}

import { DataTypes, type QueryInterface } from 'sequelize';

// Lines: a cruise's named, ordered station lists (docs/lines.md). One default line per cruise,
// computed from the casts and the plan at every read; the row holds only the analyst's choices.
export async function up(qi: QueryInterface) {
  const ts = {
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  };
  await qi.createTable('lines', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    cruise_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'cruises', key: 'id' },
      onDelete: 'CASCADE',
    },
    name: { type: DataTypes.TEXT, allowNull: false },
    is_default: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    // station names in line order (not used by the default line, whose order is computed)
    stations: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    // station name -> cast id, or {shallow, deep, joinPressure} for a composite
    casts: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    // default line: off-line stations taken back in, and stations the analyst left out
    include: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    exclude: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    // a drawn polyline [[lon, lat], ...]: distance is the projection on it
    polyline: { type: DataTypes.JSONB, allowNull: true },
    corridor_km: { type: DataTypes.DOUBLE, allowNull: true },
    created_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    ...ts,
  });
  await qi.addIndex('lines', ['cruise_id', 'name']);
  await qi.sequelize.query('CREATE UNIQUE INDEX lines_one_default ON lines (cruise_id) WHERE is_default');
}

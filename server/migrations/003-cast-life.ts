import { DataTypes, type QueryInterface } from 'sequelize';

// Casts have a life: removed (restorable), superseded by a corrected file (kept as history), partly
// read (bad lines dropped, awaiting the technician's decision). Never two live casts with the same
// station and cast number in a cruise: a unique index over the live rows says so. Earlier duplicates
// (possible before this migration) keep only their newest row live; the others become history.
export async function up(qi: QueryInterface) {
  const user = {
    type: DataTypes.UUID,
    allowNull: true,
    references: { model: 'users', key: 'id' },
    onDelete: 'SET NULL',
  };
  await qi.addColumn('casts', 'removed_at', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('casts', 'removed_by', user);
  await qi.addColumn('casts', 'superseded_by', { type: DataTypes.UUID, allowNull: true });
  await qi.addColumn('casts', 'superseded_at', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('casts', 'partly_read', { type: DataTypes.JSONB, allowNull: true });
  await qi.sequelize.query(`
    WITH ranked AS (
      SELECT id, first_value(id) OVER (PARTITION BY cruise_id, station, "cast" ORDER BY created_at DESC, id DESC) AS keep FROM casts)
    UPDATE casts SET superseded_by = ranked.keep, superseded_at = now()
    FROM ranked WHERE casts.id = ranked.id AND ranked.keep <> casts.id`);
  await qi.sequelize.query(
    'CREATE UNIQUE INDEX casts_one_live_station_cast ON casts (cruise_id, station, "cast") WHERE removed_at IS NULL AND superseded_by IS NULL',
  );
  await qi.addColumn('uploads', 'conflicts', { type: DataTypes.JSONB, allowNull: true });
}

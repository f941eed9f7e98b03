import { DataTypes, type QueryInterface } from 'sequelize';

// Saved section views shared with the cruise team: the owner shares one (or takes it back), edits
// and deletes it; the other members of the cruise read it, open it and copy it into their own.
export async function up(qi: QueryInterface) {
  await qi.addColumn('saved_views', 'shared', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
  await qi.addIndex('saved_views', ['cruise_id', 'user_id']);
  await qi.addIndex('saved_views', ['cruise_id'], { where: { shared: true }, name: 'saved_views_cruise_shared' });
}

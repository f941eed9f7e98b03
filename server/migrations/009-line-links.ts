import { DataTypes, type QueryInterface } from 'sequelize';

// Lines linked by hand as occupations of one line (docs/occupations.md); each pair once, the
// smaller id first. Lines of the same name or section identifier need no row.
export async function up(qi: QueryInterface) {
  const line = {
    type: DataTypes.UUID,
    allowNull: false,
    references: { model: 'lines', key: 'id' },
    onDelete: 'CASCADE',
  };
  await qi.createTable('line_links', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    line_a: line,
    line_b: line,
    created_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('line_links', ['line_a', 'line_b'], { unique: true });
  await qi.addIndex('line_links', ['line_b']);
}

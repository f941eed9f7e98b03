import { DataTypes, type QueryInterface } from 'sequelize';

// The intake's answers (shared/api/intakeAnswers.ts): what a technician said about files that lack a
// station, cast, position, time or the unit of a column, remembered per cruise; `kind` is 'unit' (key:
// the column name, folded) or 'cast' (key: the file name). An upload lists what its files lack in `needs`.
export async function up(qi: QueryInterface) {
  await qi.createTable('intake_answers', {
    cruise_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'cruises', key: 'id' },
      onDelete: 'CASCADE',
    },
    kind: { type: DataTypes.TEXT, allowNull: false },
    key: { type: DataTypes.TEXT, allowNull: false },
    value: { type: DataTypes.JSONB, allowNull: false },
    updated_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addConstraint('intake_answers', {
    fields: ['cruise_id', 'kind', 'key'],
    type: 'primary key',
    name: 'intake_answers_pkey',
  });
  await qi.addColumn('uploads', 'needs', { type: DataTypes.JSONB, allowNull: true });
}

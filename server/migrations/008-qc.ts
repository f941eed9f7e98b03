import { DataTypes, type QueryInterface } from 'sequelize';

// The QC desk: proposals of the automatic tests, the flag log (every flag change with the flags it replaced,
// so it can be undone), and what the intake found (its inversions) kept apart from what is true now.
export async function up(qi: QueryInterface) {
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
  const cast = {
    type: DataTypes.UUID,
    allowNull: false,
    references: { model: 'casts', key: 'id' },
    onDelete: 'CASCADE',
  };
  const user = {
    type: DataTypes.UUID,
    allowNull: true,
    references: { model: 'users', key: 'id' },
    onDelete: 'SET NULL',
  };
  await qi.createTable('flag_changes', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    cruise_id: cruise,
    cast_id: cast,
    user_id: user,
    variable: { type: DataTypes.TEXT, allowNull: false },
    p_from: { type: DataTypes.DOUBLE, allowNull: false },
    p_to: { type: DataTypes.DOUBLE, allowNull: false },
    flag: { type: DataTypes.SMALLINT, allowNull: false },
    levels: { type: DataTypes.INTEGER, allowNull: false },
    reason: DataTypes.TEXT,
    prior: { type: DataTypes.JSONB, allowNull: false },
    source: { type: DataTypes.TEXT, allowNull: false },
    proposal_id: { type: DataTypes.UUID, allowNull: true },
    undoes_id: { type: DataTypes.BIGINT, allowNull: true },
    undone_by_id: { type: DataTypes.BIGINT, allowNull: true },
    ...ts,
  });
  await qi.addIndex('flag_changes', ['cast_id', 'id']);
  await qi.createTable('qc_proposals', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    cruise_id: cruise,
    cast_id: cast,
    test: { type: DataTypes.TEXT, allowNull: false },
    variable: { type: DataTypes.TEXT, allowNull: false },
    i_from: { type: DataTypes.INTEGER, allowNull: false },
    i_to: { type: DataTypes.INTEGER, allowNull: false },
    p_from: { type: DataTypes.DOUBLE, allowNull: false },
    p_to: { type: DataTypes.DOUBLE, allowNull: false },
    levels: { type: DataTypes.INTEGER, allowNull: false },
    flag: { type: DataTypes.SMALLINT, allowNull: false },
    detail: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
    decided_by: user,
    decided_at: DataTypes.DATE,
    flag_change_id: { type: DataTypes.BIGINT, allowNull: true },
    ...ts,
  });
  await qi.addIndex('qc_proposals', ['cast_id']);
  await qi.addIndex('qc_proposals', ['cruise_id', 'status']);
  await qi.createTable('qc_intake', {
    cast_id: { ...cast, primaryKey: true },
    cruise_id: cruise,
    inversions: { type: DataTypes.JSONB, allowNull: false },
    ...ts,
  });
}

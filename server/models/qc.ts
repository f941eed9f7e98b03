// Models of the QC desk (tables of migration 008): proposals, the flag log, what the intake found.
import {
  DataTypes,
  Model,
  Sequelize,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';

export const PROPOSAL_STATUSES = ['pending', 'accepted', 'rejected'] as const;
export type ProposalStatus = (typeof PROPOSAL_STATUSES)[number];

export class QcProposalRow extends Model<InferAttributes<QcProposalRow>, InferCreationAttributes<QcProposalRow>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare castId: string;
  declare test: string;
  declare variable: string;
  declare iFrom: number;
  declare iTo: number;
  declare pFrom: number;
  declare pTo: number;
  declare levels: number;
  declare flag: number;
  declare detail: string;
  declare status: CreationOptional<ProposalStatus>;
  declare decidedBy: CreationOptional<string | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare flagChangeId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** Per flag variable, the first level index and the flags the change replaced there. */
export type PriorFlags = Record<string, { from: number; values: number[]; created: boolean }>;

export class FlagChange extends Model<InferAttributes<FlagChange>, InferCreationAttributes<FlagChange>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare castId: string;
  declare userId: string | null;
  declare variable: string;
  declare pFrom: number;
  declare pTo: number;
  declare flag: number;
  declare levels: number;
  declare reason: string | null;
  declare prior: PriorFlags;
  declare source: 'manual' | 'proposal' | 'undo';
  declare proposalId: string | null;
  declare undoesId: string | null;
  declare undoneById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class QcIntake extends Model<InferAttributes<QcIntake>, InferCreationAttributes<QcIntake>> {
  declare castId: string;
  declare cruiseId: string;
  declare inversions: unknown[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initQcModels(sequelize: Sequelize) {
  const opts = (tableName: string) => ({ sequelize, tableName, underscored: true, timestamps: true });
  const ts = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };
  QcProposalRow.init(
    {
      id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      castId: { type: DataTypes.UUID, allowNull: false },
      test: DataTypes.TEXT,
      variable: DataTypes.TEXT,
      iFrom: DataTypes.INTEGER,
      iTo: DataTypes.INTEGER,
      pFrom: DataTypes.DOUBLE,
      pTo: DataTypes.DOUBLE,
      levels: DataTypes.INTEGER,
      flag: DataTypes.SMALLINT,
      detail: DataTypes.TEXT,
      status: { type: DataTypes.TEXT, defaultValue: 'pending' },
      decidedBy: DataTypes.UUID,
      decidedAt: DataTypes.DATE,
      flagChangeId: DataTypes.BIGINT,
      ...ts,
    },
    opts('qc_proposals'),
  );
  FlagChange.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      castId: { type: DataTypes.UUID, allowNull: false },
      userId: DataTypes.UUID,
      variable: DataTypes.TEXT,
      pFrom: DataTypes.DOUBLE,
      pTo: DataTypes.DOUBLE,
      flag: DataTypes.SMALLINT,
      levels: DataTypes.INTEGER,
      reason: DataTypes.TEXT,
      prior: DataTypes.JSONB,
      source: DataTypes.TEXT,
      proposalId: DataTypes.UUID,
      undoesId: DataTypes.BIGINT,
      undoneById: DataTypes.BIGINT,
      ...ts,
    },
    opts('flag_changes'),
  );
  QcIntake.init(
    {
      castId: { type: DataTypes.UUID, primaryKey: true },
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      inversions: DataTypes.JSONB,
      ...ts,
    },
    opts('qc_intake'),
  );
}

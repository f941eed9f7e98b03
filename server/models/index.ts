// Sequelize models in one place, associations at the bottom. Tables are created by the
// migrations in server/migrations (never by sync), so the two must agree.
import {
  DataTypes,
  Model,
  Sequelize,
  type InferAttributes,
  type InferCreationAttributes,
  type CreationOptional,
  type ForeignKey,
} from 'sequelize';

import { initQcModels } from './qc';
import type { FileNeed } from '../../shared/api/intakeAnswers';

export const ROLES = ['chief_scientist', 'technician', 'analyst', 'pi'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare isAdmin: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class Cruise extends Model<InferAttributes<Cruise>, InferCreationAttributes<Cruise>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare ship: string;
  declare startDate: string;
  declare endDate: string;
  declare portStart: string | null;
  declare portEnd: string | null;
  declare region: string | null;
  declare description: string | null;
  declare locked: CreationOptional<boolean>;
  declare settings: CreationOptional<Record<string, unknown>>;
  declare createdBy: ForeignKey<string> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare cruiseId: string;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class Station extends Model<InferAttributes<Station>, InferCreationAttributes<Station>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare name: string;
  declare latitude: number;
  declare longitude: number;
  declare plannedDepth: number | null;
  declare order: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class Upload extends Model<InferAttributes<Upload>, InferCreationAttributes<Upload>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare filename: string;
  declare storageKey: string;
  declare sha256: string;
  declare size: number;
  declare status: CreationOptional<'queued' | 'processing' | 'ready' | 'failed' | 'awaiting_decision'>;
  declare progress: CreationOptional<number>;
  declare errors: CreationOptional<unknown[]>;
  declare warnings: CreationOptional<unknown[]>;
  declare castIds: CreationOptional<string[]>;
  declare unmappedHeaders: CreationOptional<string[] | null>;
  /** Casts of the upload whose station and cast are already live (migration 003): replace them or not? */
  declare conflicts: CreationOptional<{ items: UploadConflict[]; decision: 'replace' | 'keep' | null } | null>;
  /** What the files lack, for the Intake screen to ask (migration 011; shared/api/intakeAnswers.ts FileNeed) */
  declare needs: CreationOptional<FileNeed[] | null>;
  declare attempts: CreationOptional<number>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class Cast extends Model<InferAttributes<Cast>, InferCreationAttributes<Cast>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare uploadId: string | null;
  declare station: string;
  declare cast: string;
  declare latitude: number;
  declare longitude: number;
  declare time: Date | null;
  declare bottomDepth: number | null;
  declare levels: number;
  declare inversionCount: number;
  declare inversions: unknown[];
  declare fitness: CreationOptional<Record<string, unknown>>;
  declare metadata: CreationOptional<Record<string, unknown>>;
  declare notes: CreationOptional<string[]>;
  declare sourceFile: string;
  declare sourceSha256: string;
  // cast life (migration 003): removed (restorable), superseded by a corrected file, partly read
  declare removedAt: CreationOptional<Date | null>;
  declare removedBy: CreationOptional<string | null>;
  declare supersededBy: CreationOptional<string | null>;
  declare supersededAt: CreationOptional<Date | null>;
  declare partlyRead: CreationOptional<PartlyRead | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export type UploadConflict = {
  file: string;
  station: string;
  cast: string;
  existingCastId: string;
  existingFile: string;
};
/** A cast ingested without some bad lines: the lines, and the technician's decision (null: not yet). */
export type PartlyRead = {
  dropped: { file: string; line: number | null; column: number | null; code: string; message: string }[];
  decision: 'accepted' | null;
  decidedBy?: string;
  decidedAt?: string;
};
/** One row per cast and variable: the whole profile as little-endian float64 bytes (see DEVELOPERS.md). */
export class CastColumn extends Model<InferAttributes<CastColumn>, InferCreationAttributes<CastColumn>> {
  declare id: CreationOptional<number>;
  declare castId: string;
  declare name: string;
  declare unit: string | null;
  declare kind: 'measured' | 'derived' | 'flag' | 'extra';
  declare values: Buffer;
}
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  declare cruiseId: string | null;
  declare userId: string | null;
  declare action: string;
  declare entity: string;
  declare entityId: string | null;
  declare before: unknown;
  declare after: unknown;
  declare at: CreationOptional<Date>;
}
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedBy: string;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class PasswordReset extends Model<InferAttributes<PasswordReset>, InferCreationAttributes<PasswordReset>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class LoginAttempt extends Model<InferAttributes<LoginAttempt>, InferCreationAttributes<LoginAttempt>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare ip: string;
  declare succeeded: boolean;
  declare at: CreationOptional<Date>;
}
export class LayerSet extends Model<InferAttributes<LayerSet>, InferCreationAttributes<LayerSet>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare name: string;
  declare referencePressure: number;
  declare levels: string;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class ColumnMapping extends Model<InferAttributes<ColumnMapping>, InferCreationAttributes<ColumnMapping>> {
  declare id: CreationOptional<number>;
  declare cruiseId: string;
  declare header: string;
  declare role: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class DerivedVariable extends Model<InferAttributes<DerivedVariable>, InferCreationAttributes<DerivedVariable>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare name: string;
  declare formula: string;
  declare unit: string | null;
  declare description: string | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export class SavedView extends Model<InferAttributes<SavedView>, InferCreationAttributes<SavedView>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare userId: string;
  declare name: string;
  declare query: string;
  /** Shared with the cruise team: the other members read it (the owner alone edits and deletes it). */
  declare shared: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
export type DeliveryFile = { format: string; filename: string; key: string; size: number; sha256: string };
export class Delivery extends Model<InferAttributes<Delivery>, InferCreationAttributes<Delivery>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare kind: 'isopycnal' | 'pressure' | 'package';
  declare params: Record<string, unknown>;
  declare formats: string[];
  declare status: CreationOptional<'queued' | 'building' | 'ready' | 'failed'>;
  declare progress: CreationOptional<number>;
  declare files: CreationOptional<DeliveryFile[]>;
  declare error: string | null;
  declare released: CreationOptional<boolean>;
  declare releasedAt: Date | null;
  declare releasedBy: string | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** A choice of cast at a line's station: a cast id, or a composite of a shallow cast above a deep one. */
export type LineCastChoice = string | { shallow: string; deep: string; joinPressure: number };
/** A line: a named, ordered list of a cruise's stations (docs/lines.md). */
export class Line extends Model<InferAttributes<Line>, InferCreationAttributes<Line>> {
  declare id: CreationOptional<string>;
  declare cruiseId: string;
  declare name: string;
  declare isDefault: CreationOptional<boolean>;
  declare stations: CreationOptional<string[]>;
  declare casts: CreationOptional<Record<string, LineCastChoice>>;
  declare include: CreationOptional<string[]>;
  declare exclude: CreationOptional<string[]>;
  declare polyline: [number, number][] | null;
  declare corridorKm: number | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const uuid = { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true };
const ts = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };

export function initModels(sequelize: Sequelize) {
  const opts = (tableName: string, timestamps = true) => ({ sequelize, tableName, underscored: true, timestamps });
  User.init(
    {
      id: uuid,
      email: { type: DataTypes.TEXT, unique: true, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      passwordHash: DataTypes.TEXT,
      isAdmin: { type: DataTypes.BOOLEAN, defaultValue: false },
      ...ts,
    },
    opts('users'),
  );
  Cruise.init(
    {
      id: uuid,
      name: { type: DataTypes.TEXT, allowNull: false },
      ship: { type: DataTypes.TEXT, allowNull: false },
      startDate: { type: DataTypes.DATEONLY, allowNull: false },
      endDate: { type: DataTypes.DATEONLY, allowNull: false },
      portStart: DataTypes.TEXT,
      portEnd: DataTypes.TEXT,
      region: DataTypes.TEXT,
      description: DataTypes.TEXT,
      locked: { type: DataTypes.BOOLEAN, defaultValue: false },
      settings: { type: DataTypes.JSONB, defaultValue: {} },
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('cruises'),
  );
  Membership.init(
    {
      id: uuid,
      userId: { type: DataTypes.UUID, allowNull: false },
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      ...ts,
    },
    opts('memberships'),
  );
  Station.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      latitude: { type: DataTypes.DOUBLE, allowNull: false },
      longitude: { type: DataTypes.DOUBLE, allowNull: false },
      plannedDepth: DataTypes.DOUBLE,
      order: { type: DataTypes.INTEGER, allowNull: false },
      ...ts,
    },
    opts('stations'),
  );
  Upload.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      filename: { type: DataTypes.TEXT, allowNull: false },
      storageKey: { type: DataTypes.TEXT, allowNull: false },
      sha256: { type: DataTypes.TEXT, allowNull: false },
      size: { type: DataTypes.BIGINT, allowNull: false },
      status: { type: DataTypes.TEXT, defaultValue: 'queued' },
      progress: { type: DataTypes.DOUBLE, defaultValue: 0 },
      errors: { type: DataTypes.JSONB, defaultValue: [] },
      warnings: { type: DataTypes.JSONB, defaultValue: [] },
      castIds: { type: DataTypes.JSONB, defaultValue: [] },
      unmappedHeaders: { type: DataTypes.JSONB, allowNull: true },
      conflicts: { type: DataTypes.JSONB, allowNull: true },
      needs: { type: DataTypes.JSONB, allowNull: true },
      attempts: { type: DataTypes.INTEGER, defaultValue: 0 },
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('uploads'),
  );
  Cast.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      uploadId: DataTypes.UUID,
      station: { type: DataTypes.TEXT, allowNull: false },
      cast: { type: DataTypes.TEXT, allowNull: false },
      latitude: { type: DataTypes.DOUBLE, allowNull: false },
      longitude: { type: DataTypes.DOUBLE, allowNull: false },
      time: DataTypes.DATE,
      bottomDepth: DataTypes.DOUBLE,
      levels: { type: DataTypes.INTEGER, allowNull: false },
      inversionCount: { type: DataTypes.INTEGER, allowNull: false },
      inversions: { type: DataTypes.JSONB, allowNull: false },
      fitness: { type: DataTypes.JSONB, defaultValue: {} },
      metadata: { type: DataTypes.JSONB, defaultValue: {} },
      notes: { type: DataTypes.JSONB, defaultValue: [] },
      sourceFile: { type: DataTypes.TEXT, allowNull: false },
      sourceSha256: { type: DataTypes.TEXT, allowNull: false },
      removedAt: DataTypes.DATE,
      removedBy: DataTypes.UUID,
      supersededBy: DataTypes.UUID,
      supersededAt: DataTypes.DATE,
      partlyRead: DataTypes.JSONB,
      ...ts,
    },
    {
      ...opts('casts'),
      // Only live casts exist for the rest of the product: removed and superseded rows are history,
      // read with Cast.unscoped() (cast life routes only).
      defaultScope: { where: { removedAt: null, supersededBy: null } },
    },
  );
  CastColumn.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      castId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      unit: DataTypes.TEXT,
      kind: { type: DataTypes.TEXT, allowNull: false },
      values: { type: DataTypes.BLOB, allowNull: false },
    },
    opts('cast_columns', false),
  );
  AuditEntry.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      cruiseId: DataTypes.UUID,
      userId: DataTypes.UUID,
      action: { type: DataTypes.TEXT, allowNull: false },
      entity: { type: DataTypes.TEXT, allowNull: false },
      entityId: DataTypes.TEXT,
      before: DataTypes.JSONB,
      after: DataTypes.JSONB,
      at: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
    },
    opts('audit_entries', false),
  );
  Invitation.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      email: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
      invitedBy: { type: DataTypes.UUID, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: DataTypes.DATE,
      ...ts,
    },
    opts('invitations'),
  );
  PasswordReset.init(
    {
      id: uuid,
      userId: { type: DataTypes.UUID, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: DataTypes.DATE,
      ...ts,
    },
    opts('password_resets'),
  );
  LoginAttempt.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.TEXT, allowNull: false },
      ip: { type: DataTypes.TEXT, allowNull: false },
      succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
      at: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
    },
    opts('login_attempts', false),
  );
  LayerSet.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      referencePressure: { type: DataTypes.INTEGER, allowNull: false },
      levels: { type: DataTypes.TEXT, allowNull: false },
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('layer_sets'),
  );
  ColumnMapping.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      header: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      ...ts,
    },
    opts('column_mappings'),
  );

  DerivedVariable.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      formula: { type: DataTypes.TEXT, allowNull: false },
      unit: DataTypes.TEXT,
      description: DataTypes.TEXT,
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('derived_variables'),
  );
  SavedView.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      query: { type: DataTypes.TEXT, allowNull: false },
      shared: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      ...ts,
    },
    opts('saved_views'),
  );
  Delivery.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      kind: { type: DataTypes.TEXT, allowNull: false },
      params: { type: DataTypes.JSONB, allowNull: false },
      formats: { type: DataTypes.JSONB, allowNull: false },
      status: { type: DataTypes.TEXT, defaultValue: 'queued' },
      progress: { type: DataTypes.DOUBLE, defaultValue: 0 },
      files: { type: DataTypes.JSONB, defaultValue: [] },
      error: DataTypes.TEXT,
      released: { type: DataTypes.BOOLEAN, defaultValue: false },
      releasedAt: DataTypes.DATE,
      releasedBy: DataTypes.UUID,
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('deliveries'),
  );

  Line.init(
    {
      id: uuid,
      cruiseId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      isDefault: { type: DataTypes.BOOLEAN, defaultValue: false },
      stations: { type: DataTypes.JSONB, defaultValue: [] },
      casts: { type: DataTypes.JSONB, defaultValue: {} },
      include: { type: DataTypes.JSONB, defaultValue: [] },
      exclude: { type: DataTypes.JSONB, defaultValue: [] },
      polyline: { type: DataTypes.JSONB, allowNull: true },
      corridorKm: { type: DataTypes.DOUBLE, allowNull: true },
      createdBy: DataTypes.UUID,
      ...ts,
    },
    opts('lines'),
  );

  initQcModels(sequelize); // the QC desk's tables (server/models/qc.ts)

  User.hasMany(Membership, { foreignKey: 'userId' });
  Membership.belongsTo(User, { foreignKey: 'userId' });
  Cruise.hasMany(Membership, { foreignKey: 'cruiseId' });
  Membership.belongsTo(Cruise, { foreignKey: 'cruiseId' });
  Cruise.hasMany(Station, { foreignKey: 'cruiseId' });
  Cruise.hasMany(Cast, { foreignKey: 'cruiseId' });
  Cast.hasMany(CastColumn, { foreignKey: 'castId' });
  AuditEntry.belongsTo(User, { foreignKey: 'userId' });
  SavedView.belongsTo(User, { foreignKey: 'userId' });
}

import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '@toneledger/common/domain/roles';
import { initCatalogueModels } from './catalogue';
import { initImageModels } from './images';
import { initConditionModels } from './condition';
import { initMeasurementModels } from './measurements';
import { initExhibitionModels } from './exhibitions';
import { initLoanModels } from './loans';
import { initClimateModels } from './climate';
import { initInspectionRoundModels } from './inspection-rounds';

export * from './catalogue';
export * from './images';
export * from './condition';
export * from './measurements';
export * from './exhibitions';
export * from './loans';
export * from './climate';
export * from './inspection-rounds';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare issuer: string | null;
  declare subject: string | null;
  declare email: string | null;
  declare name: string;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare lastSignInAt: Date | null;
  /** Set when the person was deactivated: kept in the record, cannot sign in. */
  declare deactivatedAt: CreationOptional<Date | null>;
  declare deactivationReason: CreationOptional<string | null>;
}

export class AuditEventModel extends Model<InferAttributes<AuditEventModel>, InferCreationAttributes<AuditEventModel>> {
  declare id: CreationOptional<number>;
  declare at: CreationOptional<Date>;
  declare actorId: string | null;
  declare actorName: string | null;
  declare action: string;
  declare entityType: string;
  declare entityId: string | null;
  declare before: unknown;
  declare after: unknown;
  declare requestId: string | null;
  declare ip: string | null;
}

export function initModels(sequelize: Sequelize): void {
  User.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      issuer: DataTypes.TEXT,
      subject: DataTypes.TEXT,
      email: DataTypes.TEXT,
      name: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      lastSignInAt: DataTypes.DATE,
      deactivatedAt: DataTypes.DATE,
      deactivationReason: DataTypes.TEXT,
    },
    { sequelize, tableName: 'users', underscored: true },
  );
  AuditEventModel.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      at: DataTypes.DATE,
      actorId: DataTypes.UUID,
      actorName: DataTypes.TEXT,
      action: { type: DataTypes.TEXT, allowNull: false },
      entityType: { type: DataTypes.TEXT, allowNull: false },
      entityId: DataTypes.TEXT,
      before: DataTypes.JSONB,
      after: DataTypes.JSONB,
      requestId: DataTypes.TEXT,
      ip: DataTypes.TEXT,
    },
    { sequelize, tableName: 'audit_events', underscored: true, timestamps: false },
  );
  AuditEventModel.belongsTo(User, { as: 'actor', foreignKey: 'actorId' });
  initCatalogueModels(sequelize);
  initImageModels(sequelize);
  initConditionModels(sequelize);
  initMeasurementModels(sequelize);
  initExhibitionModels(sequelize);
  initLoanModels(sequelize);
  initClimateModels(sequelize);
  initInspectionRoundModels(sequelize);
}

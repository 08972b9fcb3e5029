import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ClimateFile as ClimateFileDto, ClimateMapping } from '@toneledger/common/schemas/climate';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** A logger CSV for a location: its text until accepted or discarded, the mapping and the last check. */
export class ClimateFile extends Model<Attrs<ClimateFile>, Create<ClimateFile>> {
  declare id: CreationOptional<string>;
  declare locationId: string;
  declare fileName: string;
  declare status: CreationOptional<ClimateFileDto['status']>;
  declare content: string | null;
  declare rowCount: CreationOptional<number>;
  declare mapping: ClimateMapping | null;
  /** The file's head (columns, sample, suggested mapping) and its last check: see presenters/climate.presenter.ts. */
  declare checkResult: unknown;
  declare acceptedRows: number | null;
  declare uploadedBy: string;
  declare uploadedAt: CreationOptional<Date>;
  declare acceptedAt: Date | null;
}

/** One reading of a location at an instant (primary key location and instant; written in batches by SQL, read by SQL). */
export class ClimateReading extends Model<Attrs<ClimateReading>, Create<ClimateReading>> {
  declare locationId: string;
  declare takenAt: Date;
  declare temperatureC: number;
  declare rhPercent: number;
  declare fileId: string;
}

export function initClimateModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true, timestamps: false };
  ClimateFile.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      locationId: { type: DataTypes.UUID, allowNull: false },
      fileName: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'uploaded' },
      content: DataTypes.TEXT,
      rowCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      mapping: DataTypes.JSONB,
      checkResult: DataTypes.JSONB,
      acceptedRows: DataTypes.INTEGER,
      uploadedBy: { type: DataTypes.UUID, allowNull: false },
      uploadedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      acceptedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'climate_files' },
  );
  ClimateReading.init(
    {
      locationId: { type: DataTypes.UUID, primaryKey: true },
      takenAt: { type: DataTypes.DATE, primaryKey: true },
      temperatureC: { type: DataTypes.REAL, allowNull: false },
      rhPercent: { type: DataTypes.REAL, allowNull: false },
      fileId: { type: DataTypes.UUID, allowNull: false },
    },
    { ...opts, tableName: 'climate_readings' },
  );
}

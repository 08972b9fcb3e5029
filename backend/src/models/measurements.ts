import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { Print } from './catalogue';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

export interface StoredLab {
  L: number;
  a: number;
  b: number;
}

/** Where a spot is: a point on one of the print's images, normalised to 0–1. */
export interface StoredPoint {
  imageId: string;
  x: number;
  y: number;
}

/** A registered place on a print that is measured again at every session. */
export class MeasurementSpot extends Model<Attrs<MeasurementSpot>, Create<MeasurementSpot>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare name: string;
  declare purpose: string;
  declare point: StoredPoint | null;
  declare notes: string | null;
  declare baselineSessionId: string | null;
  declare baselineChosenBy: string | null;
  declare baselineChosenByName: string | null;
  declare baselineChosenAt: Date | null;
  declare baselineReason: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One sitting with an instrument: its conditions, and a reading for each spot measured. Never changed once written. */
export class MeasurementSession extends Model<Attrs<MeasurementSession>, Create<MeasurementSession>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare measuredOn: string;
  declare measuredBy: string | null;
  declare measuredByName: string | null;
  declare instrument: string;
  declare serial: string | null;
  declare illuminant: string;
  declare observer: string;
  declare geometry: string;
  declare condition: string | null;
  declare aperture: string | null;
  declare backing: string | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
}

/** The readings at one spot in one session, with their mean and spread. Never changed once written. */
export class SpotReading extends Model<Attrs<SpotReading>, Create<SpotReading>> {
  declare id: CreationOptional<string>;
  declare sessionId: string;
  declare spotId: string;
  declare printId: string;
  declare readings: StoredLab[];
  declare meanL: number;
  declare meanA: number;
  declare meanB: number;
  declare n: number;
  declare sd: StoredLab | null;
  declare maxPairwiseDe: number | null;
  declare density: number | null;
  declare densityType: string | null;
  declare reflectance: number | null;
}

/** numeric comes back from pg as a string; read it as a number. */
function numeric(name: string, allowNull = true) {
  return {
    type: DataTypes.DECIMAL,
    allowNull,
    get(this: Model) {
      const v = this.getDataValue(name) as unknown;
      return v === null || v === undefined ? null : Number(v);
    },
  };
}

export function initMeasurementModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  MeasurementSpot.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      purpose: { type: DataTypes.TEXT, allowNull: false },
      point: DataTypes.JSONB,
      notes: DataTypes.TEXT,
      baselineSessionId: DataTypes.UUID,
      baselineChosenBy: DataTypes.UUID,
      baselineChosenByName: DataTypes.TEXT,
      baselineChosenAt: DataTypes.DATE,
      baselineReason: DataTypes.TEXT,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'measurement_spots' },
  );
  MeasurementSession.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      measuredOn: { type: DataTypes.DATEONLY, allowNull: false },
      measuredBy: DataTypes.UUID,
      measuredByName: DataTypes.TEXT,
      instrument: { type: DataTypes.TEXT, allowNull: false },
      serial: DataTypes.TEXT,
      illuminant: { type: DataTypes.TEXT, allowNull: false },
      observer: { type: DataTypes.TEXT, allowNull: false },
      geometry: { type: DataTypes.TEXT, allowNull: false },
      condition: DataTypes.TEXT,
      aperture: DataTypes.TEXT,
      backing: DataTypes.TEXT,
      notes: DataTypes.TEXT,
      createdAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'measurement_sessions', updatedAt: false },
  );
  SpotReading.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      sessionId: { type: DataTypes.UUID, allowNull: false },
      spotId: { type: DataTypes.UUID, allowNull: false },
      printId: { type: DataTypes.UUID, allowNull: false },
      readings: { type: DataTypes.JSONB, allowNull: false },
      meanL: numeric('meanL', false),
      meanA: numeric('meanA', false),
      meanB: numeric('meanB', false),
      n: { type: DataTypes.INTEGER, allowNull: false },
      sd: DataTypes.JSONB,
      maxPairwiseDe: numeric('maxPairwiseDe'),
      density: numeric('density'),
      densityType: DataTypes.TEXT,
      reflectance: numeric('reflectance'),
    },
    { ...opts, tableName: 'spot_readings', timestamps: false },
  );

  MeasurementSpot.belongsTo(Print, { as: 'print', foreignKey: 'printId' });
  MeasurementSession.hasMany(SpotReading, { as: 'readings', foreignKey: 'sessionId' });
  SpotReading.belongsTo(MeasurementSession, { as: 'session', foreignKey: 'sessionId' });
  SpotReading.belongsTo(MeasurementSpot, { as: 'spot', foreignKey: 'spotId' });
}

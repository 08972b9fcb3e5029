import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { Print } from './catalogue';
import { Image } from './images';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** One word of the deterioration vocabulary. Built-in terms can be switched off but never removed. */
export class ConditionTerm extends Model<Attrs<ConditionTerm>, Create<ConditionTerm>> {
  declare code: string;
  declare label: string;
  declare description: string | null;
  declare active: CreationOptional<boolean>;
  declare builtIn: CreationOptional<boolean>;
  declare position: CreationOptional<number>;
}

/** A dated examination of one print: a draft its author edits, then signed and locked (the database refuses changes). */
export class ConditionReport extends Model<Attrs<ConditionReport>, Create<ConditionReport>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare examinedOn: string;
  declare examinerId: string | null;
  declare examinerName: string;
  declare context: string;
  declare grade: string | null;
  declare summary: string | null;
  declare recommendations: string | null;
  declare nextCheckOn: string | null;
  declare loanId: CreationOptional<string | null>;
  declare status: CreationOptional<'draft' | 'signed'>;
  declare signedAt: Date | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** The shape drawn on an image; the image itself is the region_image_id column. */
export interface StoredRegion {
  shape: 'rect' | 'polygon';
  points: [number, number][];
}

export class Observation extends Model<Attrs<Observation>, Create<Observation>> {
  declare id: CreationOptional<string>;
  declare reportId: string;
  declare position: number;
  declare termCode: string;
  declare side: string;
  declare area: string;
  declare extent: string;
  declare extentPercent: number | null;
  declare severity: string;
  declare notes: string | null;
  declare region: StoredRegion | null;
  declare regionImageId: string | null;
}

/** A correction or addition to a signed report. Append-only at the database. */
export class Addendum extends Model<Attrs<Addendum>, Create<Addendum>> {
  declare id: CreationOptional<string>;
  declare reportId: string;
  declare authorId: string | null;
  declare authorName: string;
  declare writtenAt: CreationOptional<Date>;
  declare text: string;
}

export function initConditionModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  ConditionTerm.init(
    {
      code: { type: DataTypes.TEXT, primaryKey: true },
      label: { type: DataTypes.TEXT, allowNull: false },
      description: DataTypes.TEXT,
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      builtIn: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1000 },
    },
    { ...opts, tableName: 'condition_terms', timestamps: false },
  );
  ConditionReport.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      examinedOn: { type: DataTypes.DATEONLY, allowNull: false },
      examinerId: DataTypes.UUID,
      examinerName: { type: DataTypes.TEXT, allowNull: false },
      context: { type: DataTypes.TEXT, allowNull: false },
      grade: DataTypes.TEXT,
      summary: DataTypes.TEXT,
      recommendations: DataTypes.TEXT,
      nextCheckOn: DataTypes.DATEONLY,
      loanId: DataTypes.UUID,
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
      signedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'condition_reports' },
  );
  Observation.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      reportId: { type: DataTypes.UUID, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      termCode: { type: DataTypes.TEXT, allowNull: false },
      side: { type: DataTypes.TEXT, allowNull: false },
      area: { type: DataTypes.TEXT, allowNull: false },
      extent: { type: DataTypes.TEXT, allowNull: false },
      // numeric comes back from pg as a string; read it as a number.
      extentPercent: {
        type: DataTypes.DECIMAL,
        get(this: Observation) {
          const v = this.getDataValue('extentPercent') as unknown;
          return v === null || v === undefined ? null : Number(v);
        },
      },
      severity: { type: DataTypes.TEXT, allowNull: false },
      notes: DataTypes.TEXT,
      region: DataTypes.JSONB,
      regionImageId: DataTypes.UUID,
    },
    { ...opts, tableName: 'observations', timestamps: false },
  );
  Addendum.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      reportId: { type: DataTypes.UUID, allowNull: false },
      authorId: DataTypes.UUID,
      authorName: { type: DataTypes.TEXT, allowNull: false },
      writtenAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      text: { type: DataTypes.TEXT, allowNull: false },
    },
    { ...opts, tableName: 'addenda', timestamps: false },
  );

  ConditionReport.belongsTo(Print, { as: 'print', foreignKey: 'printId' });
  ConditionReport.hasMany(Observation, { as: 'observations', foreignKey: 'reportId' });
  ConditionReport.hasMany(Addendum, { as: 'addenda', foreignKey: 'reportId' });
  Observation.belongsTo(ConditionTerm, { as: 'term', foreignKey: 'termCode' });
  Observation.belongsTo(Image, { as: 'regionImage', foreignKey: 'regionImageId' });
}

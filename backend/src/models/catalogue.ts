import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { IngredientInput } from '@toneledger/common/schemas/catalogue';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** Columns every versioned record has. */
const versioned = {
  id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
  version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  createdAt: DataTypes.DATE,
  updatedAt: DataTypes.DATE,
};

export class Maker extends Model<Attrs<Maker>, Create<Maker>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare lifeDates: string | null;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Paper extends Model<Attrs<Paper>, Create<Paper>> {
  declare id: CreationOptional<string>;
  declare manufacturer: string;
  declare product: string;
  declare base: 'fibre' | 'rc' | 'other';
  declare surface: string | null;
  declare baseTint: string | null;
  declare weight: string | null;
  declare opticalBrighteners: 'yes' | 'no' | 'unknown';
  declare madeDates: string | null;
  declare madeEarliest: string | null;
  declare madeLatest: string | null;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class BathRecipe extends Model<Attrs<BathRecipe>, Create<BathRecipe>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare tonerClass: string | null;
  declare volumeMl: number;
  declare ingredients: IngredientInput[];
  declare mixingNotes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Location extends Model<Attrs<Location>, Create<Location>> {
  declare id: CreationOptional<string>;
  declare parentId: string | null;
  declare name: string;
  declare kind: string;
  declare code: string | null;
  declare notes: string | null;
  declare pathLabel: string;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class EnclosureType extends Model<Attrs<EnclosureType>, Create<EnclosureType>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare material: string | null;
  declare alkalineBuffered: boolean | null;
  declare patResult: 'passed' | 'failed' | 'not_tested';
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Print extends Model<Attrs<Print>, Create<Print>> {
  declare id: CreationOptional<string>;
  declare accessionNumber: string;
  declare accessionSort: string;
  declare title: string;
  declare makerId: string | null;
  declare makerName: string | null;
  declare dateMade: string | null;
  declare dateDisplay: string | null;
  declare dateEarliest: string | null;
  declare dateLatest: string | null;
  declare imageWidthMm: number | null;
  declare imageHeightMm: number | null;
  declare sheetWidthMm: number | null;
  declare sheetHeightMm: number | null;
  declare mountWidthMm: number | null;
  declare mountHeightMm: number | null;
  declare process: string;
  declare support: string | null;
  declare paperId: string | null;
  declare paperLabel: string | null;
  declare inscriptions: string | null;
  declare provenance: string | null;
  declare creditLine: string | null;
  declare rights: string | null;
  declare status: string;
  declare locationId: string | null;
  declare enclosureId: string | null;
  declare lightResponsivity: string | null;
  declare staffNotes: string | null;
  declare valuationAmount: number | null;
  declare valuationCurrency: string | null;
  declare borrowed: CreationOptional<boolean>;
  declare tonerClasses: CreationOptional<string[]>;
  declare warningCodes: CreationOptional<string[]>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class ProcessStep extends Model<Attrs<ProcessStep>, Create<ProcessStep>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare position: number;
  declare type: string;
  declare agent: string | null;
  declare tonerClass: string | null;
  declare recipeId: string | null;
  declare dilution: string | null;
  declare timeSeconds: number | null;
  declare temperatureC: number | null;
  declare extent: string | null;
  declare concentration: string | null;
  declare alkaline: boolean | null;
  declare method: string | null;
  declare value: number | null;
  declare unit: string | null;
  declare notes: string | null;
}

export class Movement extends Model<Attrs<Movement>, Create<Movement>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare fromLocationId: string | null;
  declare toLocationId: string;
  declare movedAt: CreationOptional<Date>;
  declare movedBy: string | null;
  declare movedByName: string | null;
  declare reason: string;
}

export class Setting extends Model<Attrs<Setting>, Create<Setting>> {
  declare key: string;
  declare value: unknown;
  declare updatedAt: CreationOptional<Date>;
}

export class ImportJobModel extends Model<Attrs<ImportJobModel>, Create<ImportJobModel>> {
  declare id: CreationOptional<string>;
  declare kind: CreationOptional<string>;
  declare fileName: string;
  declare source: string;
  declare status: string;
  declare totalRows: CreationOptional<number>;
  declare processedRows: CreationOptional<number>;
  declare errorCount: CreationOptional<number>;
  declare errors: CreationOptional<unknown[]>;
  declare newMakers: CreationOptional<string[]>;
  declare createdPrints: CreationOptional<number>;
  declare stepsFileName: CreationOptional<string | null>;
  declare stepsSource: CreationOptional<string | null>;
  declare stepRows: CreationOptional<number>;
  declare toCreate: CreationOptional<number>;
  declare toUpdate: CreationOptional<number>;
  declare unchangedRows: CreationOptional<number>;
  declare ignoredColumns: CreationOptional<string[]>;
  declare planHash: CreationOptional<string | null>;
  declare mode: CreationOptional<'create_only' | 'create_or_update' | null>;
  declare updatedPrints: CreationOptional<number>;
  declare message: string | null;
  declare createdBy: string | null;
  /** Who asked for the commit, and that request's id: a commit resumed after a restart writes for them. */
  declare committedBy: CreationOptional<string | null>;
  declare commitRequestId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare finishedAt: Date | null;
}

// numeric columns come back from pg as strings; read them as numbers.
const num = (field: string) => ({
  type: DataTypes.DECIMAL,
  get(this: Model) {
    const v = this.getDataValue(field as never) as unknown;
    return v === null || v === undefined ? null : Number(v);
  },
});

export function initCatalogueModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  Maker.init({ ...versioned, name: { type: DataTypes.TEXT, allowNull: false }, lifeDates: DataTypes.TEXT, notes: DataTypes.TEXT }, { ...opts, tableName: 'makers' });
  Paper.init(
    {
      ...versioned,
      manufacturer: { type: DataTypes.TEXT, allowNull: false },
      product: { type: DataTypes.TEXT, allowNull: false },
      base: { type: DataTypes.TEXT, allowNull: false },
      surface: DataTypes.TEXT,
      baseTint: DataTypes.TEXT,
      weight: DataTypes.TEXT,
      opticalBrighteners: { type: DataTypes.TEXT, allowNull: false },
      madeDates: DataTypes.TEXT,
      madeEarliest: DataTypes.DATEONLY,
      madeLatest: DataTypes.DATEONLY,
      notes: DataTypes.TEXT,
    },
    { ...opts, tableName: 'papers' },
  );
  BathRecipe.init(
    {
      ...versioned,
      name: { type: DataTypes.TEXT, allowNull: false },
      tonerClass: DataTypes.TEXT,
      volumeMl: { ...num('volumeMl'), allowNull: false },
      ingredients: { type: DataTypes.JSONB, allowNull: false },
      mixingNotes: DataTypes.TEXT,
    },
    { ...opts, tableName: 'bath_recipes' },
  );
  Location.init(
    {
      ...versioned,
      parentId: DataTypes.UUID,
      name: { type: DataTypes.TEXT, allowNull: false },
      kind: { type: DataTypes.TEXT, allowNull: false },
      code: DataTypes.TEXT,
      notes: DataTypes.TEXT,
      pathLabel: { type: DataTypes.TEXT, allowNull: false },
    },
    { ...opts, tableName: 'locations' },
  );
  EnclosureType.init(
    {
      ...versioned,
      name: { type: DataTypes.TEXT, allowNull: false },
      material: DataTypes.TEXT,
      alkalineBuffered: DataTypes.BOOLEAN,
      patResult: { type: DataTypes.TEXT, allowNull: false },
      notes: DataTypes.TEXT,
    },
    { ...opts, tableName: 'enclosure_types' },
  );
  Print.init(
    {
      ...versioned,
      accessionNumber: { type: DataTypes.TEXT, allowNull: false },
      accessionSort: { type: DataTypes.TEXT, allowNull: false },
      title: { type: DataTypes.TEXT, allowNull: false },
      makerId: DataTypes.UUID,
      makerName: DataTypes.TEXT,
      dateMade: DataTypes.TEXT,
      dateDisplay: DataTypes.TEXT,
      dateEarliest: DataTypes.DATEONLY,
      dateLatest: DataTypes.DATEONLY,
      imageWidthMm: num('imageWidthMm'),
      imageHeightMm: num('imageHeightMm'),
      sheetWidthMm: num('sheetWidthMm'),
      sheetHeightMm: num('sheetHeightMm'),
      mountWidthMm: num('mountWidthMm'),
      mountHeightMm: num('mountHeightMm'),
      process: { type: DataTypes.TEXT, allowNull: false },
      support: DataTypes.TEXT,
      paperId: DataTypes.UUID,
      paperLabel: DataTypes.TEXT,
      inscriptions: DataTypes.TEXT,
      provenance: DataTypes.TEXT,
      creditLine: DataTypes.TEXT,
      rights: DataTypes.TEXT,
      status: { type: DataTypes.TEXT, allowNull: false },
      locationId: DataTypes.UUID,
      enclosureId: DataTypes.UUID,
      lightResponsivity: DataTypes.TEXT,
      staffNotes: DataTypes.TEXT,
      valuationAmount: num('valuationAmount'),
      valuationCurrency: DataTypes.TEXT,
      borrowed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      tonerClasses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
      warningCodes: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    },
    { ...opts, tableName: 'prints' },
  );
  ProcessStep.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      type: { type: DataTypes.TEXT, allowNull: false },
      agent: DataTypes.TEXT,
      tonerClass: DataTypes.TEXT,
      recipeId: DataTypes.UUID,
      dilution: DataTypes.TEXT,
      timeSeconds: DataTypes.INTEGER,
      temperatureC: num('temperatureC'),
      extent: DataTypes.TEXT,
      concentration: DataTypes.TEXT,
      alkaline: DataTypes.BOOLEAN,
      method: DataTypes.TEXT,
      value: num('value'),
      unit: DataTypes.TEXT,
      notes: DataTypes.TEXT,
    },
    { ...opts, tableName: 'process_steps', timestamps: false },
  );
  Movement.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      fromLocationId: DataTypes.UUID,
      toLocationId: { type: DataTypes.UUID, allowNull: false },
      movedAt: DataTypes.DATE,
      movedBy: DataTypes.UUID,
      movedByName: DataTypes.TEXT,
      reason: { type: DataTypes.TEXT, allowNull: false },
    },
    { ...opts, tableName: 'movements', timestamps: false },
  );
  Setting.init(
    { key: { type: DataTypes.TEXT, primaryKey: true }, value: { type: DataTypes.JSONB, allowNull: false }, updatedAt: DataTypes.DATE },
    { ...opts, tableName: 'settings', createdAt: false },
  );
  ImportJobModel.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      kind: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'prints' },
      fileName: { type: DataTypes.TEXT, allowNull: false },
      source: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false },
      totalRows: { type: DataTypes.INTEGER, defaultValue: 0 },
      processedRows: { type: DataTypes.INTEGER, defaultValue: 0 },
      errorCount: { type: DataTypes.INTEGER, defaultValue: 0 },
      errors: { type: DataTypes.JSONB, defaultValue: [] },
      newMakers: { type: DataTypes.JSONB, defaultValue: [] },
      createdPrints: { type: DataTypes.INTEGER, defaultValue: 0 },
      stepsFileName: DataTypes.TEXT,
      stepsSource: DataTypes.TEXT,
      stepRows: { type: DataTypes.INTEGER, defaultValue: 0 },
      toCreate: { type: DataTypes.INTEGER, defaultValue: 0 },
      toUpdate: { type: DataTypes.INTEGER, defaultValue: 0 },
      unchangedRows: { type: DataTypes.INTEGER, defaultValue: 0 },
      ignoredColumns: { type: DataTypes.JSONB, defaultValue: [] },
      planHash: DataTypes.TEXT,
      mode: DataTypes.TEXT,
      updatedPrints: { type: DataTypes.INTEGER, defaultValue: 0 },
      message: DataTypes.TEXT,
      createdBy: DataTypes.UUID,
      committedBy: DataTypes.UUID,
      commitRequestId: DataTypes.TEXT,
      createdAt: DataTypes.DATE,
      finishedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'imports', updatedAt: false },
  );

  Print.belongsTo(Maker, { as: 'maker', foreignKey: 'makerId' });
  Print.belongsTo(Paper, { as: 'paper', foreignKey: 'paperId' });
  Print.belongsTo(Location, { as: 'location', foreignKey: 'locationId' });
  Print.belongsTo(EnclosureType, { as: 'enclosure', foreignKey: 'enclosureId' });
  Print.hasMany(ProcessStep, { as: 'steps', foreignKey: 'printId' });
  ProcessStep.belongsTo(BathRecipe, { as: 'recipe', foreignKey: 'recipeId' });
  Movement.belongsTo(Location, { as: 'from', foreignKey: 'fromLocationId' });
  Movement.belongsTo(Location, { as: 'to', foreignKey: 'toLocationId' });
}

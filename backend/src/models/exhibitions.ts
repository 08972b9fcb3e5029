import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** An exhibition: an in-house rotation, a show of our own, or a borrower's show our prints go to. */
export class Exhibition extends Model<Attrs<Exhibition>, Create<Exhibition>> {
  declare id: CreationOptional<string>;
  declare title: string;
  declare organiser: string | null;
  declare summary: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One venue of an exhibition with its dates; a touring show has several, in order. */
export class ExhibitionVenue extends Model<Attrs<ExhibitionVenue>, Create<ExhibitionVenue>> {
  declare id: CreationOptional<string>;
  declare exhibitionId: string;
  declare position: number;
  declare name: string;
  declare place: string | null;
  declare opensOn: string;
  declare closesOn: string;
}

/** A print on an exhibition's object list, with the conservator's decision. */
export class ExhibitionObject extends Model<Attrs<ExhibitionObject>, Create<ExhibitionObject>> {
  declare exhibitionId: string;
  declare printId: string;
  declare approval: CreationOptional<'pending' | 'approved' | 'refused'>;
  declare reason: string | null;
  declare approvedBy: string | null;
  declare approvedAt: Date | null;
  declare addedAt: CreationOptional<Date>;
}

/** A period a print spends on display, from which its light dose is summed. */
export class DisplayPeriod extends Model<Attrs<DisplayPeriod>, Create<DisplayPeriod>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare exhibitionId: string;
  declare venueId: string | null;
  declare startsOn: string;
  declare endsOn: string;
  declare lux: number;
  declare hoursPerDay: number;
  declare daysOpen: number[];
  declare closedDates: string[];
  declare uv: number | null;
  declare caseOrFrame: string | null;
  declare mountNotes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** numeric comes back from pg as a string; read it as a number. */
function num(name: string, allowNull = true) {
  return {
    type: DataTypes.DECIMAL,
    allowNull,
    get(this: Model) {
      const v = this.getDataValue(name as never) as unknown;
      return v === null || v === undefined ? null : Number(v);
    },
  };
}

export function initExhibitionModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  Exhibition.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      title: { type: DataTypes.TEXT, allowNull: false },
      organiser: DataTypes.TEXT,
      summary: DataTypes.TEXT,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'exhibitions' },
  );
  ExhibitionVenue.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      exhibitionId: { type: DataTypes.UUID, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      place: DataTypes.TEXT,
      opensOn: { type: DataTypes.DATEONLY, allowNull: false },
      closesOn: { type: DataTypes.DATEONLY, allowNull: false },
    },
    { ...opts, tableName: 'exhibition_venues', timestamps: false },
  );
  ExhibitionObject.init(
    {
      exhibitionId: { type: DataTypes.UUID, primaryKey: true },
      printId: { type: DataTypes.UUID, primaryKey: true },
      approval: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
      reason: DataTypes.TEXT,
      approvedBy: DataTypes.UUID,
      approvedAt: DataTypes.DATE,
      addedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
    },
    { ...opts, tableName: 'exhibition_objects', timestamps: false },
  );
  DisplayPeriod.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      exhibitionId: { type: DataTypes.UUID, allowNull: false },
      venueId: DataTypes.UUID,
      startsOn: { type: DataTypes.DATEONLY, allowNull: false },
      endsOn: { type: DataTypes.DATEONLY, allowNull: false },
      lux: num('lux', false),
      hoursPerDay: num('hoursPerDay', false),
      daysOpen: { type: DataTypes.ARRAY(DataTypes.SMALLINT), allowNull: false },
      closedDates: { type: DataTypes.ARRAY(DataTypes.DATEONLY), allowNull: false, defaultValue: [] },
      uv: num('uv'),
      caseOrFrame: DataTypes.TEXT,
      mountNotes: DataTypes.TEXT,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'display_periods' },
  );
  ExhibitionVenue.belongsTo(Exhibition, { foreignKey: 'exhibitionId' });
  Exhibition.hasMany(ExhibitionVenue, { as: 'venues', foreignKey: 'exhibitionId' });
}

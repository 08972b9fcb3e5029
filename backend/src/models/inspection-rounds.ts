import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** A dated round of checks assigned to one person. Each change bumps `version` (the calendar feed's SEQUENCE). */
export class InspectionRound extends Model<Attrs<InspectionRound>, Create<InspectionRound>> {
  declare id: CreationOptional<string>;
  declare title: string;
  declare plannedOn: string;
  declare status: CreationOptional<'planned' | 'done' | 'cancelled'>;
  declare assigneeId: string;
  declare notes: string | null;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare version: CreationOptional<number>;
}

/** One print in a round; checked off by the condition report signed for it. */
export class InspectionRoundItem extends Model<Attrs<InspectionRoundItem>, Create<InspectionRoundItem>> {
  declare roundId: string;
  declare printId: string;
  declare position: number;
  declare checkedOn: string | null;
  declare conditionReportId: string | null;
  declare addedAt: CreationOptional<Date>;
}

export function initInspectionRoundModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  InspectionRound.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      title: { type: DataTypes.TEXT, allowNull: false },
      plannedOn: { type: DataTypes.DATEONLY, allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'planned' },
      assigneeId: { type: DataTypes.UUID, allowNull: false },
      notes: DataTypes.TEXT,
      createdBy: { type: DataTypes.UUID, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    },
    { ...opts, tableName: 'inspection_rounds' },
  );
  InspectionRoundItem.init(
    {
      roundId: { type: DataTypes.UUID, primaryKey: true },
      printId: { type: DataTypes.UUID, primaryKey: true },
      position: { type: DataTypes.INTEGER, allowNull: false },
      checkedOn: DataTypes.DATEONLY,
      conditionReportId: DataTypes.UUID,
      addedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    },
    { ...opts, tableName: 'inspection_round_items', timestamps: false },
  );
}

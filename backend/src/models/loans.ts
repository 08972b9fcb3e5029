import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { Print } from './catalogue';
import { ConditionReport } from './condition';

type Attrs<M extends Model> = InferAttributes<M>;
type Create<M extends Model> = InferCreationAttributes<M>;

/** A loan out (the collection lends) or in (the collection borrows). Its status moves in order (LOAN_NEXT). */
export class Loan extends Model<Attrs<Loan>, Create<Loan>> {
  declare id: CreationOptional<string>;
  declare direction: 'out' | 'in';
  declare reference: string;
  declare otherInstitution: string;
  declare contactName: string | null;
  declare contactEmail: string | null;
  declare purpose: string;
  declare exhibitionId: string | null;
  declare venue: string | null;
  declare dispatchOn: string | null;
  declare opensOn: string | null;
  declare closesOn: string | null;
  declare returnOn: string | null;
  declare courier: string | null;
  declare maxLux: number | null;
  declare maxAnnualLuxHours: number | null;
  declare temperatureMinC: number | null;
  declare temperatureMaxC: number | null;
  declare rhMinPercent: number | null;
  declare rhMaxPercent: number | null;
  declare noAlkalineBufferedMounts: CreationOptional<boolean>;
  declare otherConditions: string | null;
  declare creditLine: string | null;
  declare notes: string | null;
  declare status: CreationOptional<string>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One print on a loan, with its value and the place it left from (a loan out), for the way back. */
export class LoanObject extends Model<Attrs<LoanObject>, Create<LoanObject>> {
  declare loanId: string;
  declare printId: string;
  declare position: number;
  declare insuranceValue: number | null;
  declare currency: string | null;
  declare homeLocationId: string | null;
  declare addedAt: CreationOptional<Date>;
}

/** A dated change of a loan's status. Append-only at the database. */
export class LoanStatusChange extends Model<Attrs<LoanStatusChange>, Create<LoanStatusChange>> {
  declare id: CreationOptional<number>;
  declare loanId: string;
  declare fromStatus: string | null;
  declare toStatus: string;
  declare onDate: string;
  declare note: string | null;
  declare byId: string | null;
  declare byName: string | null;
  declare at: CreationOptional<Date>;
}

/** numeric comes back from pg as a string; read it as a number. */
function num<M extends Model>(name: string) {
  return {
    type: DataTypes.DECIMAL,
    get(this: M) {
      const v = this.getDataValue(name as never) as unknown;
      return v === null || v === undefined ? null : Number(v);
    },
  };
}

export function initLoanModels(sequelize: Sequelize): void {
  const opts = { sequelize, underscored: true };
  Loan.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      direction: { type: DataTypes.TEXT, allowNull: false },
      reference: { type: DataTypes.TEXT, allowNull: false },
      otherInstitution: { type: DataTypes.TEXT, allowNull: false },
      contactName: DataTypes.TEXT,
      contactEmail: DataTypes.TEXT,
      purpose: { type: DataTypes.TEXT, allowNull: false },
      exhibitionId: DataTypes.UUID,
      venue: DataTypes.TEXT,
      dispatchOn: DataTypes.DATEONLY,
      opensOn: DataTypes.DATEONLY,
      closesOn: DataTypes.DATEONLY,
      returnOn: DataTypes.DATEONLY,
      courier: DataTypes.TEXT,
      maxLux: num<Loan>('maxLux'),
      maxAnnualLuxHours: num<Loan>('maxAnnualLuxHours'),
      temperatureMinC: num<Loan>('temperatureMinC'),
      temperatureMaxC: num<Loan>('temperatureMaxC'),
      rhMinPercent: num<Loan>('rhMinPercent'),
      rhMaxPercent: num<Loan>('rhMaxPercent'),
      noAlkalineBufferedMounts: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      otherConditions: DataTypes.TEXT,
      creditLine: DataTypes.TEXT,
      notes: DataTypes.TEXT,
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'proposed' },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...opts, tableName: 'loans' },
  );
  LoanObject.init(
    {
      loanId: { type: DataTypes.UUID, primaryKey: true },
      printId: { type: DataTypes.UUID, primaryKey: true },
      position: { type: DataTypes.INTEGER, allowNull: false },
      insuranceValue: num<LoanObject>('insuranceValue'),
      currency: DataTypes.TEXT,
      homeLocationId: DataTypes.UUID,
      addedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    },
    { ...opts, tableName: 'loan_objects', timestamps: false },
  );
  LoanStatusChange.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      loanId: { type: DataTypes.UUID, allowNull: false },
      fromStatus: DataTypes.TEXT,
      toStatus: { type: DataTypes.TEXT, allowNull: false },
      onDate: { type: DataTypes.DATEONLY, allowNull: false },
      note: DataTypes.TEXT,
      byId: DataTypes.UUID,
      byName: DataTypes.TEXT,
      at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    },
    { ...opts, tableName: 'loan_status_changes', timestamps: false },
  );
  LoanObject.belongsTo(Print, { as: 'print', foreignKey: 'printId' });
  Loan.hasMany(LoanObject, { as: 'objects', foreignKey: 'loanId' });
  ConditionReport.belongsTo(Loan, { as: 'loan', foreignKey: 'loanId' });
}

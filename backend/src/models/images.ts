import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Image extends Model<InferAttributes<Image>, InferCreationAttributes<Image>> {
  declare id: CreationOptional<string>;
  declare printId: string;
  declare viewType: string;
  declare capturedOn: string | null;
  declare notes: string | null;
  declare fileName: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare width: number;
  declare height: number;
  declare sha256: string;
  declare originalKey: string;
  declare thumbKey: string | null;
  declare screenKey: string | null;
  declare derivatives: CreationOptional<'pending' | 'ready' | 'failed'>;
  declare exif: Record<string, unknown>;
  declare uploadedBy: string | null;
  declare uploadedByName: string | null;
  declare uploadedAt: CreationOptional<Date>;
  declare withdrawnAt: Date | null;
  declare withdrawnByName: string | null;
  declare withdrawnReason: string | null;
  declare purgeAfter: Date | null;
  declare purgedAt: Date | null;
  declare version: CreationOptional<number>;
}

export class FixityCheck extends Model<InferAttributes<FixityCheck>, InferCreationAttributes<FixityCheck>> {
  declare id: CreationOptional<number>;
  declare imageId: string;
  declare checkedAt: CreationOptional<Date>;
  declare outcome: 'match' | 'mismatch' | 'missing' | 'error';
  declare expected: string;
  declare actual: string | null;
  declare detail: string | null;
}

export class ImageAlignment extends Model<InferAttributes<ImageAlignment>, InferCreationAttributes<ImageAlignment>> {
  declare id: CreationOptional<string>;
  declare baseImageId: string;
  declare otherImageId: string;
  declare offsetX: number;
  declare offsetY: number;
  declare scale: number;
  declare rotationDeg: number;
  declare savedByName: string | null;
  declare savedAt: CreationOptional<Date>;
}

export function initImageModels(sequelize: Sequelize): void {
  Image.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      printId: { type: DataTypes.UUID, allowNull: false },
      viewType: { type: DataTypes.TEXT, allowNull: false },
      capturedOn: DataTypes.DATEONLY,
      notes: DataTypes.TEXT,
      fileName: { type: DataTypes.TEXT, allowNull: false },
      contentType: { type: DataTypes.TEXT, allowNull: false },
      sizeBytes: { type: DataTypes.BIGINT, allowNull: false },
      width: { type: DataTypes.INTEGER, allowNull: false },
      height: { type: DataTypes.INTEGER, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      originalKey: { type: DataTypes.TEXT, allowNull: false },
      thumbKey: DataTypes.TEXT,
      screenKey: DataTypes.TEXT,
      derivatives: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
      exif: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      uploadedBy: DataTypes.UUID,
      uploadedByName: DataTypes.TEXT,
      uploadedAt: DataTypes.DATE,
      withdrawnAt: DataTypes.DATE,
      withdrawnByName: DataTypes.TEXT,
      withdrawnReason: DataTypes.TEXT,
      purgeAfter: DataTypes.DATE,
      purgedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    },
    { sequelize, tableName: 'images', underscored: true, timestamps: false },
  );
  FixityCheck.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      imageId: { type: DataTypes.UUID, allowNull: false },
      checkedAt: DataTypes.DATE,
      outcome: { type: DataTypes.TEXT, allowNull: false },
      expected: { type: DataTypes.CHAR(64), allowNull: false },
      actual: DataTypes.CHAR(64),
      detail: DataTypes.TEXT,
    },
    { sequelize, tableName: 'fixity_checks', underscored: true, timestamps: false },
  );
  ImageAlignment.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      baseImageId: { type: DataTypes.UUID, allowNull: false },
      otherImageId: { type: DataTypes.UUID, allowNull: false },
      offsetX: { type: DataTypes.DOUBLE, allowNull: false },
      offsetY: { type: DataTypes.DOUBLE, allowNull: false },
      scale: { type: DataTypes.DOUBLE, allowNull: false },
      rotationDeg: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      savedByName: DataTypes.TEXT,
      savedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'image_alignments', underscored: true, timestamps: false },
  );
}

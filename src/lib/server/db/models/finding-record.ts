import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { SEVERITIES, type Severity } from '../../../lint/finding';

/** A finding's standing against the baseline build. */
export const FINDING_STATUSES = ['new', 'unchanged', 'fixed'] as const;
export type FindingStatus = (typeof FINDING_STATUSES)[number];

/**
 * A stored lint finding of one build (see `Finding` in the lint library for field meanings).
 * `fixed` rows record baseline findings that disappeared; their asset may be gone, so
 * `assetId` can be null and `assetPath` keeps the path.
 */
export class FindingRecord extends Model<InferAttributes<FindingRecord>, InferCreationAttributes<FindingRecord>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare assetId: number | null;
  declare assetPath: string;
  declare rule: string;
  declare severity: Severity;
  declare status: FindingStatus;
  declare waived: CreationOptional<boolean>;
  declare waiverId: number | null;
  declare animation: string | null;
  declare channel: number | null;
  declare node: string | null;
  declare keyFirst: number | null;
  declare keyLast: number | null;
  declare timeSeconds: number | null;
  /** `FindingValues` as JSON text. */
  declare valuesJson: string | null;
  declare message: string;
  declare hint: string;
  declare fingerprint: string;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof FindingRecord {
    FindingRecord.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        buildId: { type: DataTypes.INTEGER, allowNull: false },
        assetId: { type: DataTypes.INTEGER, allowNull: true },
        assetPath: { type: DataTypes.STRING(1024), allowNull: false },
        rule: { type: DataTypes.STRING(64), allowNull: false },
        severity: { type: DataTypes.STRING(8), allowNull: false, validate: { isIn: [SEVERITIES] } },
        status: { type: DataTypes.STRING(10), allowNull: false, validate: { isIn: [FINDING_STATUSES] } },
        waived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        waiverId: { type: DataTypes.INTEGER, allowNull: true },
        animation: { type: DataTypes.STRING(255), allowNull: true },
        channel: { type: DataTypes.INTEGER, allowNull: true },
        node: { type: DataTypes.STRING(1024), allowNull: true },
        keyFirst: { type: DataTypes.INTEGER, allowNull: true },
        keyLast: { type: DataTypes.INTEGER, allowNull: true },
        timeSeconds: { type: DataTypes.DOUBLE, allowNull: true },
        valuesJson: { type: DataTypes.TEXT, allowNull: true },
        message: { type: DataTypes.TEXT, allowNull: false },
        hint: { type: DataTypes.TEXT, allowNull: false },
        fingerprint: { type: DataTypes.STRING(32), allowNull: false }
      },
      { sequelize, modelName: 'Finding', tableName: 'findings', timestamps: false }
    );
    return FindingRecord;
  }
}

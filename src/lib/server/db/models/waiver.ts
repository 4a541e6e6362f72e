import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** What a waiver covers: one finding by fingerprint, or one rule on one asset path. */
export const WAIVER_SCOPES = ['fingerprint', 'rule-asset'] as const;
export type WaiverScope = (typeof WAIVER_SCOPES)[number];

/** A waiver's life: proposed by anyone who can submit, approved or rejected by a lead, revoked later. */
export const WAIVER_STATUSES = ['proposed', 'approved', 'rejected', 'revoked'] as const;
export type WaiverStatus = (typeof WAIVER_STATUSES)[number];

/**
 * An accepted exception: findings it covers still show but no longer fail the gate.
 * A `fingerprint` waiver needs `fingerprint`; a `rule-asset` waiver needs `rule` and `assetPath`
 * (the database checks both). `expiresAt` ends it without anyone revoking it.
 */
export class Waiver extends Model<InferAttributes<Waiver>, InferCreationAttributes<Waiver>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare scope: WaiverScope;
  declare fingerprint: string | null;
  declare rule: string | null;
  declare assetPath: string | null;
  declare reason: string;
  declare expiresAt: Date | null;
  declare status: CreationOptional<WaiverStatus>;
  declare proposedById: number | null;
  declare decidedById: CreationOptional<number | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof Waiver {
    Waiver.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        scope: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [WAIVER_SCOPES] } },
        fingerprint: { type: DataTypes.STRING(32), allowNull: true },
        rule: { type: DataTypes.STRING(64), allowNull: true },
        assetPath: { type: DataTypes.STRING(1024), allowNull: true },
        reason: { type: DataTypes.TEXT, allowNull: false, validate: { len: [1, 4000] } },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        status: {
          type: DataTypes.STRING(10),
          allowNull: false,
          defaultValue: 'proposed',
          validate: { isIn: [WAIVER_STATUSES] }
        },
        proposedById: { type: DataTypes.INTEGER, allowNull: true },
        decidedById: { type: DataTypes.INTEGER, allowNull: true },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      {
        sequelize,
        tableName: 'waivers',
        validate: {
          scopeHasItsFields(this: Waiver) {
            if (this.scope === 'fingerprint' && !this.fingerprint)
              throw new Error('a fingerprint waiver needs a fingerprint');
            if (this.scope === 'rule-asset' && (!this.rule || !this.assetPath)) {
              throw new Error('a rule-asset waiver needs a rule and an asset path');
            }
          }
        }
      }
    );
    return Waiver;
  }
}

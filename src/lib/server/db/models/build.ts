import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** The CI gate's answer for a build. */
export const BUILD_VERDICTS = ['pass', 'fail'] as const;
export type BuildVerdict = (typeof BUILD_VERDICTS)[number];

/**
 * One submission of assets from CI for a project, branch and commit, with its verdict and
 * counts. Counts are kept on the row so the home page and trends never scan findings:
 * `errorCount`/`warningCount`/`infoCount` are the open findings (new or unchanged, not waived)
 * by severity; `newCount`/`unchangedCount` split the open ones against the baseline;
 * `fixedCount` counts baseline findings that are gone; `waivedCount` the ones an approved waiver covers.
 * A retry with the same `idempotencyKey` for the project returns the existing build.
 */
export class Build extends Model<InferAttributes<Build>, InferCreationAttributes<Build>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare branch: string;
  declare commitSha: string | null;
  declare label: string | null;
  declare ciJobUrl: string | null;
  declare idempotencyKey: string | null;
  declare verdict: BuildVerdict;
  /** One sentence on why the gate decided so, e.g. "2 new errors in hero.glb". */
  declare verdictReason: string | null;
  /** The base-branch build compared against; null for the first build. */
  declare baselineBuildId: number | null;
  declare policyVersion: string;
  declare engineVersion: string;
  declare errorCount: CreationOptional<number>;
  declare warningCount: CreationOptional<number>;
  declare infoCount: CreationOptional<number>;
  declare newCount: CreationOptional<number>;
  declare unchangedCount: CreationOptional<number>;
  declare fixedCount: CreationOptional<number>;
  declare waivedCount: CreationOptional<number>;
  declare assetCount: CreationOptional<number>;
  declare durationMs: number | null;
  declare createdAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof Build {
    // A fresh object per column: Sequelize writes the column name into the definition it is given.
    const count = () => ({ type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, validate: { min: 0 } });
    Build.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        branch: { type: DataTypes.STRING(255), allowNull: false, validate: { len: [1, 255] } },
        commitSha: { type: DataTypes.STRING(64), allowNull: true },
        label: { type: DataTypes.STRING(200), allowNull: true },
        ciJobUrl: { type: DataTypes.STRING(2048), allowNull: true },
        idempotencyKey: { type: DataTypes.STRING(200), allowNull: true },
        verdict: { type: DataTypes.STRING(8), allowNull: false, validate: { isIn: [BUILD_VERDICTS] } },
        verdictReason: { type: DataTypes.TEXT, allowNull: true },
        baselineBuildId: { type: DataTypes.INTEGER, allowNull: true },
        policyVersion: { type: DataTypes.STRING(32), allowNull: false },
        engineVersion: { type: DataTypes.STRING(32), allowNull: false },
        errorCount: count(),
        warningCount: count(),
        infoCount: count(),
        newCount: count(),
        unchangedCount: count(),
        fixedCount: count(),
        waivedCount: count(),
        assetCount: count(),
        durationMs: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE
      },
      { sequelize, tableName: 'builds', updatedAt: false }
    );
    return Build;
  }
}

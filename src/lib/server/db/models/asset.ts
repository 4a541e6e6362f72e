import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/**
 * One glTF file as submitted in a build. `contentHash` with `policyVersion` lets ingestion
 * reuse an earlier lint of identical bytes; the counts and `worstRule` feed report lists.
 */
export class Asset extends Model<InferAttributes<Asset>, InferCreationAttributes<Asset>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  /** Path as submitted, forward slashes, relative to the build root. */
  declare path: string;
  /** Lower-case hex SHA-256 of the file's bytes. */
  declare contentHash: string;
  declare byteLength: number;
  declare policyVersion: string;
  declare unreadable: CreationOptional<boolean>;
  /** `AssetStats` as JSON text. */
  declare statsJson: string | null;
  declare errorCount: CreationOptional<number>;
  declare warningCount: CreationOptional<number>;
  declare infoCount: CreationOptional<number>;
  /** Rule of the heaviest finding, for sorting and badges; null when clean. */
  declare worstRule: string | null;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof Asset {
    // A fresh object per column: Sequelize writes the column name into the definition it is given.
    const count = () => ({ type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, validate: { min: 0 } });
    Asset.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        buildId: { type: DataTypes.INTEGER, allowNull: false },
        path: { type: DataTypes.STRING(1024), allowNull: false, validate: { len: [1, 1024] } },
        contentHash: { type: DataTypes.STRING(64), allowNull: false, validate: { is: /^[0-9a-f]{64}$/ } },
        byteLength: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 0 } },
        policyVersion: { type: DataTypes.STRING(32), allowNull: false },
        unreadable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        statsJson: { type: DataTypes.TEXT, allowNull: true },
        errorCount: count(),
        warningCount: count(),
        infoCount: count(),
        worstRule: { type: DataTypes.STRING(64), allowNull: true }
      },
      { sequelize, tableName: 'assets', timestamps: false }
    );
    return Asset;
  }
}

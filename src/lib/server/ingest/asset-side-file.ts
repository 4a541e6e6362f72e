/**
 * A side file (buffer or image) one stored asset read while it was linted: its path relative to
 * the asset's folder and the SHA-256 of what was read, or null when the asset named a file the
 * build did not send. Table `asset_side_files` (migration 0002).
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { getDatabase } from '../db/instance';
import { Asset } from '../db/models';

/** A row of `asset_side_files`. */
export class AssetSideFile extends Model<InferAttributes<AssetSideFile>, InferCreationAttributes<AssetSideFile>> {
  declare id: CreationOptional<number>;
  declare assetId: number;
  /** Relative to the asset's folder, e.g. `hero.bin` or `textures/skin.png`. */
  declare path: string;
  /** Lower-case hex SHA-256 of the file, or null when it was not sent. */
  declare contentHash: string | null;

  /** Binds the model to a Sequelize instance (columns mirror migration 0002). */
  static initModel(sequelize: Sequelize): typeof AssetSideFile {
    AssetSideFile.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        assetId: { type: DataTypes.INTEGER, allowNull: false },
        path: { type: DataTypes.STRING(1024), allowNull: false, validate: { len: [1, 1024] } },
        contentHash: { type: DataTypes.STRING(64), allowNull: true, validate: { is: /^[0-9a-f]{64}$/ } }
      },
      { sequelize, tableName: 'asset_side_files', timestamps: false }
    );
    return AssetSideFile;
  }
}

/**
 * The model, bound to the same database as the shared models. Those are bound when a database is
 * opened; this one binds on first use, and again after another database was opened (tests, scripts).
 */
export function assetSideFiles(): typeof AssetSideFile {
  const sequelize = Asset.sequelize ?? getDatabase().sequelize;
  if (AssetSideFile.sequelize !== sequelize) AssetSideFile.initModel(sequelize);
  return AssetSideFile;
}

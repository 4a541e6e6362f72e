/**
 * Migration 0002: the side files (buffers, images) each stored asset read while it was linted,
 * with the SHA-256 of each or NULL when the asset named a file the build did not send. Ingestion
 * reuses an earlier lint only when these match the new upload, and the channel plots read an
 * asset back from its blobs through them.
 */
import { DataTypes, type QueryInterface } from 'sequelize';
import { columnTypes } from './column-types';

/** Name recorded in the migration table once applied. */
export const name = '0002-asset-side-files';

/** Creates `asset_side_files`, one row per (asset, side-file path). */
export async function up(queryInterface: QueryInterface): Promise<void> {
  const { checked, onlyCharacters } = columnTypes(queryInterface);
  await queryInterface.createTable('asset_side_files', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    assetId: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'assets', key: 'id' },
      onDelete: 'CASCADE'
    },
    /** Path relative to the asset's folder, as the asset's URI resolved. */
    path: { type: checked('VARCHAR(1024)', `"path" <> ''`), allowNull: false },
    contentHash: {
      type: checked(
        'CHAR(64)',
        `"contentHash" IS NULL OR (length("contentHash") = 64 AND ${onlyCharacters('contentHash', '0-9a-f')})`
      ),
      allowNull: true
    }
  });
  await queryInterface.addIndex('asset_side_files', ['assetId', 'path'], {
    name: 'asset_side_files_asset_path',
    unique: true
  });
}

/** Drops `asset_side_files`. */
export async function down(queryInterface: QueryInterface): Promise<void> {
  await queryInterface.dropTable('asset_side_files');
}

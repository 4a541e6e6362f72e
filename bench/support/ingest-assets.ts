/**
 * The ingestion benchmark's build: `assetCount` animated GLBs of about `targetByteLength` each,
 * made with {@link buildEngineAsset} (20 joints, LINEAR and CUBICSPLINE channels, defects the
 * rules find). Each asset of each variant gets its own key count, so all contents differ and the
 * server cannot reuse one asset's lint or blob for another, within a build or across rounds.
 */
import fs from 'node:fs';
import path from 'node:path';
import { buildEngineAsset } from './engine-asset';

/** Options of {@link writeIngestAssets}. */
export interface IngestAssetsOptions {
  folder: string;
  assetCount: number;
  /** Wanted size of each GLB in bytes; the key count per joint is chosen to land near it. */
  targetByteLength: number;
  /**
   * 0 to {@link MAX_VARIANTS} - 1: gives every asset content no other variant has (a few keys
   * more or less), for uploads with nothing to reuse.
   */
  variant: number;
}

/** How many variants of the build differ in every asset. */
export const MAX_VARIANTS = 8;

/** What was written. */
export interface IngestAssets {
  paths: string[];
  byteLength: number;
  rotationKeys: number;
}

const JOINTS = 20;
const CUBIC_EVERY = 4;

/**
 * Writes the assets into `folder` (emptied first) as `deck-<nn>/rigger-<nn>.glb`, a folder per
 * asset as a game's export tree has them.
 */
export async function writeIngestAssets(options: IngestAssetsOptions): Promise<IngestAssets> {
  if (!Number.isInteger(options.variant) || options.variant < 0 || options.variant >= MAX_VARIANTS) {
    throw new RangeError(`variant must be a whole number from 0 to ${MAX_VARIANTS - 1}, got ${options.variant}`);
  }
  fs.rmSync(options.folder, { recursive: true, force: true });
  // Bytes per key across the rig: a time (4) plus per LINEAR channel a VEC4 (16) and per
  // CUBICSPLINE channel in-tangent, value and out-tangent (48), glTF 2.0 §3.11 accessor sizes.
  const cubicChannels = Math.floor(JOINTS / CUBIC_EVERY);
  const bytesPerKey = 4 + (JOINTS - cubicChannels) * 16 + cubicChannels * 48;
  const baseKeys = Math.round(options.targetByteLength / bytesPerKey);
  const paths: string[] = [];
  let byteLength = 0;
  let rotationKeys = 0;
  for (let index = 0; index < options.assetCount; index++) {
    // Unique per (asset, variant), centred on the key count that gives the wanted size.
    const keysPerJoint = baseKeys + (index - Math.floor(options.assetCount / 2)) * MAX_VARIANTS + options.variant;
    const asset = await buildEngineAsset({ jointCount: JOINTS, keysPerJoint, cubicEvery: CUBIC_EVERY });
    const name = String(index + 1).padStart(2, '0');
    const file = path.join(options.folder, `deck-${name}`, `rigger-${name}.glb`);
    fs.mkdirSync(path.dirname(file), { recursive: true });
    fs.writeFileSync(file, asset.bytes);
    paths.push(file);
    byteLength += asset.bytes.byteLength;
    rotationKeys += asset.rotationKeys;
  }
  return { paths, byteLength, rotationKeys };
}

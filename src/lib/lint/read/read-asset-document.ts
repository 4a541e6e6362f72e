/**
 * Reads a `.glb` or `.gltf` from bytes into a @gltf-transform/core Document, or fails with one
 * {@link AssetReadError} that says what is wrong with the file and what to do.
 *
 * Design notes: @gltf-transform/core's own GLB and URI handling is bypassed on purpose. Its GLB
 * parser builds Uint32Arrays at the input's byte offset (a RangeError on an unaligned Node Buffer
 * slice) and trusts chunk lengths; its URI handling would fetch whatever a file names. Here the
 * container is split with bounds checks (parse-container.ts), the JSON shape and every reference
 * are checked (gltf-json-schema.ts, check-references.ts), every URI is resolved or refused
 * (resolve-uri.ts), and only then does `readJSON({ json, resources })` run. The checks walk the
 * JSON only, never the binary data. Measured on the engine benchmark (46 MB GLB, 2 million keys,
 * 400 accessors), where @gltf-transform/core alone reads in about 52 ms on a quiet machine: container
 * split 0.3 ms, zod shape check about 1 ms; the whole checked read measured 3–6% slower than the bare one.
 */
import { type Document, Logger, WebIO, type Extension } from '@gltf-transform/core';
import { ALL_EXTENSIONS, EXTMeshoptCompression, KHRDracoMeshCompression } from '@gltf-transform/extensions';
import { AssetReadError, isAssetReadError } from '../asset-read-error';
import type { AssetSource } from '../asset-source';
import { checkReferences } from './check-references';
import { gltfJsonSchema, type GltfJson } from './gltf-json-schema';
import { attachKeyframeViews, detachKeyframeAccessors } from './keyframe-views';
import { loadResources } from './load-resources';
import { parseContainer } from './parse-container';
import { recordStoredRotations } from './stored-rotation';
import { stripDraco, usesDraco } from './strip-draco';

/** Options for reading an asset. */
export interface ReadOptions {
  /**
   * A Draco decoder module (`await draco3dgltf.createDecoderModule()` in Node). Without it,
   * Draco-compressed geometry is skipped and everything else (animations, nodes, skins) still reads.
   */
  dracoDecoder?: unknown;
  /**
   * Read image bytes too. Lint needs none, so by default image URIs are checked but not read and
   * textures hold empty placeholders: pass true when the Document will be written back (fixes).
   */
  includeImages?: boolean;
  /**
   * Largest total of decoded accessor and meshopt data, plus the keys each rotation channel makes
   * the rules walk, in bytes. Defaults to 256 MiB plus four times the file's own size: real files
   * decode to about their size, so only claimed counts far beyond the data present, or many
   * channels sharing one huge accessor (a damaged or hostile file), hit it.
   */
  maxDecodedByteLength?: number;
  /**
   * Let animation accessors view the file's own bytes instead of holding copies (see
   * keyframe-views.ts): saves copying every key. The Document then shares `source.bytes`, so
   * pass it only when the Document is never written to or written back (lint does so).
   */
  viewKeyframes?: boolean;
}

/** A read Document with the byte count behind it. */
export interface ReadAssetResult {
  document: Document;
  /** Main file plus every side file read. */
  byteLength: number;
  /** Primitives whose Draco geometry was skipped for want of a decoder. */
  skippedDracoPrimitives: number;
}

const BASE_DECODE_BUDGET = 256 * 1024 * 1024;
const SILENT = new Logger(Logger.Verbosity.SILENT);
const MESHOPT = 'EXT_meshopt_compression';
const BASE_EXTENSIONS = ALL_EXTENSIONS.filter(
  (extension) => extension !== KHRDracoMeshCompression && extension !== EXTMeshoptCompression
);
const KNOWN_EXTENSION_NAMES = new Set(ALL_EXTENSIONS.map((extension) => extension.EXTENSION_NAME));

/**
 * Reads an asset's bytes (and side files through `source.readSideFile`) into a Document.
 * @throws AssetReadError for every problem caused by the file or its side files.
 */
export async function readAssetDocument(source: AssetSource, options: ReadOptions = {}): Promise<Document> {
  return (await readAsset(source, options)).document;
}

/**
 * Like {@link readAssetDocument}, also giving the bytes read and what was skipped. Anything thrown
 * while reading is about the file, so it always surfaces as an AssetReadError (unexpected ones as
 * `asset.decode-failed`, the original kept as `cause`): one odd file never stops a build's lint.
 */
export async function readAsset(source: AssetSource, options: ReadOptions = {}): Promise<ReadAssetResult> {
  try {
    return await readAssetUnguarded(source, options);
  } catch (error) {
    if (isAssetReadError(error)) throw error;
    throw new AssetReadError(
      'asset.decode-failed',
      `${source.path}: the file could not be read: ${(error as Error)?.message ?? String(error)}`,
      'Export the asset again; if it loads elsewhere, report this file to the Orientry maintainers.',
      { cause: error }
    );
  }
}

async function readAssetUnguarded(source: AssetSource, options: ReadOptions): Promise<ReadAssetResult> {
  const { json: rawJson, binChunk, isGlb } = parseContainer(source.bytes, source.path);
  const json = checkShape(rawJson, source.path);

  const extensions: (typeof Extension)[] = [...BASE_EXTENSIONS];
  const dependencies: Record<string, unknown> = {};
  for (const name of json.extensionsRequired ?? []) {
    if (!KNOWN_EXTENSION_NAMES.has(name)) {
      throw new AssetReadError(
        'asset.extension-unsupported',
        `${source.path}: the file requires the extension ${name}, which this reader does not support.`,
        'Export the asset without that extension.'
      );
    }
  }
  let skippedDracoPrimitives = 0;
  if (usesDraco(json)) {
    if (options.dracoDecoder) {
      extensions.push(KHRDracoMeshCompression);
      dependencies['draco3d.decoder'] = options.dracoDecoder;
    } else {
      skippedDracoPrimitives = stripDraco(json);
    }
  }
  if (json.extensionsUsed?.includes(MESHOPT) || json.extensionsRequired?.includes(MESHOPT)) {
    extensions.push(EXTMeshoptCompression);
    dependencies['meshopt.decoder'] = await loadMeshoptDecoder(source.path);
  }

  const { resources, bufferBytes, sideFileByteLength } = await loadResources(
    json,
    binChunk,
    isGlb,
    source,
    options.includeImages ?? false
  );
  const byteLength = source.bytes.byteLength + sideFileByteLength;
  checkReferences({
    json,
    assetPath: source.path,
    bufferBytes,
    maxDecodedByteLength: options.maxDecodedByteLength ?? BASE_DECODE_BUDGET + 4 * byteLength
  });

  const accessorCount = json.accessors?.length ?? 0;
  const keyframeViews = options.viewKeyframes ? detachKeyframeAccessors(json, bufferBytes) : [];
  let document: Document;
  try {
    const io = new WebIO().setLogger(SILENT).registerExtensions(extensions).registerDependencies(dependencies);
    document = await io.readJSON({ json: json as never, resources: resources as never });
    attachKeyframeViews(document, keyframeViews, accessorCount);
  } catch (error) {
    if (isAssetReadError(error)) throw error;
    throw new AssetReadError(
      'asset.decode-failed',
      `${source.path}: the glTF reader rejected the file: ${(error as Error)?.message ?? String(error)}`,
      'Export the asset again; if it loads elsewhere, report this file to the Orientry maintainers.',
      { cause: error }
    );
  }
  recordStoredRotations(document.getRoot().listNodes(), json.nodes ?? []);
  return { document, byteLength, skippedDracoPrimitives };
}

/** Checks that the JSON is a glTF 2.0 document of the expected shape. */
function checkShape(rawJson: unknown, path: string): GltfJson {
  const asset = (rawJson as { asset?: { version?: unknown } } | null)?.asset;
  if (typeof rawJson !== 'object' || rawJson === null || Array.isArray(rawJson) || typeof asset !== 'object') {
    throw new AssetReadError(
      'asset.not-gltf',
      `${path}: the JSON has no "asset" object, so it is not a glTF file.`,
      'Upload .glb or .gltf files only.'
    );
  }
  const version = asset?.version;
  if (version !== '2.0') {
    throw new AssetReadError(
      'asset.unsupported-version',
      `${path}: asset.version is ${JSON.stringify(version)}; only glTF 2.0 is supported.`,
      'Convert the asset to glTF 2.0.'
    );
  }
  const result = gltfJsonSchema.safeParse(rawJson);
  if (result.success) return result.data;
  const issues = result.error.issues
    .slice(0, 3)
    .map((issue) => `${issue.path.join('.') || '(root)'}: ${issue.message}`);
  const more = result.error.issues.length > 3 ? ` (and ${result.error.issues.length - 3} more)` : '';
  throw new AssetReadError(
    'asset.structure-invalid',
    `${path}: the glTF JSON breaks the glTF 2.0 schema at ${issues.join('; ')}${more}.`,
    'Export the asset again; the exporter or a hand edit wrote an invalid glTF file.',
    { cause: result.error }
  );
}

/** The meshopt decoder, loaded on first use so assets without meshopt never pay for its WebAssembly. */
async function loadMeshoptDecoder(path: string): Promise<unknown> {
  const { MeshoptDecoder } = await import('meshoptimizer/decoder');
  await MeshoptDecoder.ready;
  if (!MeshoptDecoder.supported) {
    throw new AssetReadError(
      'asset.extension-unsupported',
      `${path}: the file uses EXT_meshopt_compression, but this runtime cannot run its WebAssembly decoder.`,
      'Lint the file in Node or a browser with WebAssembly support.'
    );
  }
  return MeshoptDecoder;
}

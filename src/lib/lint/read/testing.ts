/**
 * Builders for reader tests: small animated Documents made with @gltf-transform/core, written to
 * GLB or .gltf bytes, and AssetSources over them whose `readSideFile` is a recording stub. Each
 * test states its keys; interpolation is always set explicitly.
 */
import { Document, WebIO, type Extension, type TypedArray } from '@gltf-transform/core';
import type { AssetSource } from '../asset-source';
import type { Interpolation } from './rotation-channel';

/** One rotation channel to build: its node name, times, raw output array and interpolation. */
export interface ChannelBuild {
  nodeName: string;
  interpolation: Interpolation;
  times: number[];
  /** Output data as stored: float32 or an integer array for quantized outputs. */
  output: TypedArray;
  normalized?: boolean;
  outputType?: 'VEC4' | 'VEC3' | 'SCALAR';
  restRotation?: [number, number, number, number];
  /** Name of a parent node to create above this one. */
  parentName?: string;
}

/** A Document with one animation (`Sway`) holding one rotation channel per build, one node each. */
export function buildAnimatedDocument(builds: ChannelBuild[]): Document {
  const document = new Document();
  const buffer = document.createBuffer();
  const scene = document.createScene('Harbor');
  const animation = document.createAnimation('Sway');
  for (const build of builds) {
    const node = document.createNode(build.nodeName);
    if (build.restRotation) node.setRotation(build.restRotation);
    if (build.parentName) {
      const parent = document.createNode(build.parentName).addChild(node);
      scene.addChild(parent);
    } else {
      scene.addChild(node);
    }
    const input = document.createAccessor().setType('SCALAR').setArray(new Float32Array(build.times)).setBuffer(buffer);
    const output = document
      .createAccessor()
      .setType(build.outputType ?? 'VEC4')
      .setArray(build.output)
      .setNormalized(build.normalized ?? false)
      .setBuffer(buffer);
    const sampler = document
      .createAnimationSampler()
      .setInput(input)
      .setOutput(output)
      .setInterpolation(build.interpolation);
    animation.addSampler(sampler);
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(node).setTargetPath('rotation').setSampler(sampler)
    );
  }
  return document;
}

/** GLB bytes of a Document, with the given extensions registered for writing. */
export async function writeGlb(
  document: Document,
  extensions: (typeof Extension)[] = [],
  dependencies: Record<string, unknown> = {}
): Promise<Uint8Array> {
  return new WebIO().registerExtensions(extensions).registerDependencies(dependencies).writeBinary(document);
}

/** .gltf JSON text bytes and side files of a Document; buffers are written as `<basename>.bin`. */
export async function writeGltf(
  document: Document,
  basename: string
): Promise<{ bytes: Uint8Array; sideFiles: Record<string, Uint8Array> }> {
  const { json, resources } = await new WebIO().writeJSON(document, { basename });
  return { bytes: new TextEncoder().encode(JSON.stringify(json)), sideFiles: { ...resources } };
}

/** A recording AssetSource: `requested` lists every side-file path asked for, in order. */
export interface RecordingSource extends AssetSource {
  requested: string[];
}

/** An AssetSource over in-memory bytes; side files not in the map resolve null (not provided). */
export function sourceFromBytes(
  path: string,
  bytes: Uint8Array,
  sideFiles: Record<string, Uint8Array> = {}
): RecordingSource {
  const requested: string[] = [];
  return {
    path,
    bytes,
    requested,
    async readSideFile(relativePath: string) {
      requested.push(relativePath);
      return sideFiles[relativePath] ?? null;
    }
  };
}

/** UTF-8 bytes of a JSON value. */
export function jsonBytes(value: unknown): Uint8Array {
  return new TextEncoder().encode(JSON.stringify(value));
}

/** A base64 data URI of bytes (test helper; the reader has its own strict decoder). */
export function dataUriOf(bytes: Uint8Array): string {
  let binary = '';
  for (const byte of bytes) binary += String.fromCharCode(byte);
  return `data:application/octet-stream;base64,${btoa(binary)}`;
}

/** Bytes of float32 and other typed arrays laid end to end. */
export function concatBytes(...arrays: ArrayBufferView[]): Uint8Array {
  const total = arrays.reduce((sum, array) => sum + array.byteLength, 0);
  const bytes = new Uint8Array(total);
  let offset = 0;
  for (const array of arrays) {
    bytes.set(new Uint8Array(array.buffer, array.byteOffset, array.byteLength), offset);
    offset += array.byteLength;
  }
  return bytes;
}

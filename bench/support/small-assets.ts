/**
 * Small animated GLBs for the submission-rate benchmark: a prop with one joint and a one-second
 * LINEAR rotation clip of 31 keys about +Y (q = [0, sin(θ/2), 0, cos(θ/2)], Shoemake 1985). Every
 * fifth asset flips the sign of one key (a hemisphere jump), so submissions carry findings. The
 * `variant` turns every asset a little further, so each submission sends new contents and the
 * server lints every file instead of reusing an earlier lint.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Document, NodeIO } from '@gltf-transform/core';

const KEY_COUNT = 31;
const io = new NodeIO();

/** Writes `count` GLBs into `folder` (emptied first) and returns their total size in bytes. */
export async function writeSmallAssets(folder: string, count: number, variant: number): Promise<number> {
  fs.rmSync(folder, { recursive: true, force: true });
  fs.mkdirSync(folder, { recursive: true });
  let byteLength = 0;
  for (let index = 0; index < count; index++) {
    const bytes = await io.writeBinary(propDocument(index, variant));
    fs.writeFileSync(path.join(folder, `prop-${String(index).padStart(2, '0')}.glb`), bytes);
    byteLength += bytes.byteLength;
  }
  return byteLength;
}

function propDocument(index: number, variant: number): Document {
  const document = new Document();
  const buffer = document.createBuffer();
  const joint = document.createNode(`Hinge${index}`);
  document.createScene('Dock').addChild(document.createNode(`Prop${index}`).addChild(joint));
  const times = new Float32Array(KEY_COUNT);
  const values = new Float32Array(KEY_COUNT * 4);
  const totalDegrees = 30 + index + variant * 0.25;
  for (let key = 0; key < KEY_COUNT; key++) {
    times[key] = key / 30;
    const half = ((totalDegrees * key) / (KEY_COUNT - 1)) * (Math.PI / 360);
    values.set([0, Math.sin(half), 0, Math.cos(half)], key * 4);
  }
  if (index % 5 === 0) for (let component = 0; component < 4; component++) values[15 * 4 + component] *= -1;
  const sampler = document
    .createAnimationSampler()
    .setInput(document.createAccessor().setType('SCALAR').setArray(times).setBuffer(buffer))
    .setOutput(document.createAccessor().setType('VEC4').setArray(values).setBuffer(buffer))
    .setInterpolation('LINEAR');
  const animation = document.createAnimation('Sway').addSampler(sampler);
  animation.addChannel(
    document.createAnimationChannel().setTargetNode(joint).setTargetPath('rotation').setSampler(sampler)
  );
  return document;
}

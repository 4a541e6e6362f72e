import { it } from 'vitest';
import { defaultPolicy, lintAsset } from '$lib/lint/index';
import { buildSeedAssets, gltfJsonOf } from '../seed-assets';
it('probe', async () => {
  const seed = await buildSeedAssets();
  for (const [count, copies] of [[2_000_000, 1], [2_000_000, 10], [2_000_000, 20]]) {
    const json = gltfJsonOf(seed) as any;
    for (const index of [3, 4]) { delete json.accessors[index].bufferView; delete json.accessors[index].byteOffset; json.accessors[index].count = count; }
    delete json.accessors[3].max; delete json.accessors[3].min;
    for (let i = 0; i < copies; i++) json.animations.push({ name: 'A' + i, samplers: [{ input: 3, output: 4, interpolation: 'LINEAR' }], channels: [{ sampler: 0, target: { node: 0, path: 'rotation' } }] });
    const bytes = new TextEncoder().encode(JSON.stringify(json));
    const t = performance.now();
    const report = await lintAsset({ path: 'x.gltf', bytes, readSideFile: async (p) => seed.sideFiles[p] ?? null }, defaultPolicy());
    console.log(count, copies, bytes.length, Math.round(performance.now() - t), 'ms', report.unreadable, report.findings.length, process.memoryUsage.rss()/1e6, process.resourceUsage().maxRSS/1e3);
  }
}, 300000);

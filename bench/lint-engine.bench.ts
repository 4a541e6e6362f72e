/**
 * Engine benchmark: how much linting adds on top of merely reading a large animated GLB.
 *
 * Generates a 200-joint rig with 10,000 rotation keys per joint (2 million keys, LINEAR and
 * CUBICSPLINE mixed, with defects), then measures in this process:
 * - @gltf-transform/core alone reading the GLB (`WebIO.readBinary`), the floor any lint pays;
 * - the whole lint (`lintAsset`: checked read, channel and fact extraction, every rule);
 * - the rule pass alone over already-read channels (`runRules`, the pass lintAsset runs), as keys
 *   per second, with a per-rule breakdown, next to a loop that only reads every key: the floor any
 *   pass over the keys pays, which shows how much of the rule budget is left for computing;
 * and, in a fresh child process that only loads the file and lints it once, the peak memory
 * (the OS peak RSS, plus RSS sampled between phases and process.memoryUsage()).
 * Each timing is the median of RUNS runs after warm-ups, with the fastest run beside it: on a busy
 * machine the median moves with the load, the minimum and the CPU time much less. Targets are
 * judged on wall-time medians.
 * Targets: whole lint ≤ 1.25 × read alone; rule pass ≥ 100 million keys/s; peak ≤ 2 × file + 150 MB.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { WebIO } from '@gltf-transform/core';
import {
  RULES,
  lintAsset,
  parsePolicy,
  readAsset,
  readAssetFacts,
  readRotationChannels,
  type RotationChannel
} from '$lib/lint/index';
import { runRules } from '$lib/lint/lint-document';
import { buildEngineAsset } from './support/engine-asset';
import {
  collectGarbage,
  formatMarkdownTable,
  formatMegabytes,
  formatTable,
  formatTiming,
  measureMs,
  timeOnce,
  type BenchRow
} from './support/measure';

const JOINTS = 200;
const KEYS_PER_JOINT = 10_000;
const CUBIC_EVERY = 4;
const RUNS = 15;
const WARMUPS = 3;
const ASSET_PATH = 'tidewatch/deckhand.glb';
const GLB_PATH = 'bench-output/lint-engine.glb';
const TARGET_RATIO = 1.25;
const TARGET_KEYS_PER_SECOND = 100e6;
const TARGET_MEMORY_SLACK_BYTES = 150 * 2 ** 20;

const policy = parsePolicy({});
const sourceOf = (bytes: Uint8Array) => ({
  path: ASSET_PATH,
  bytes,
  readSideFile: async () => null
});

if (process.argv[2] === '--memory-probe') {
  await probeMemory(process.argv[3]);
} else {
  await main();
}

async function main(): Promise<void> {
  process.stderr.write(`Generating ${JOINTS} joints × ${KEYS_PER_JOINT} keys...\n`);
  const asset = await buildEngineAsset({ jointCount: JOINTS, keysPerJoint: KEYS_PER_JOINT, cubicEvery: CUBIC_EVERY });
  mkdirSync('bench-output', { recursive: true });
  writeFileSync(GLB_PATH, asset.bytes);
  const bytes = readFileSync(GLB_PATH);

  process.stderr.write('Timing reads and lints...\n');
  const readAlone = await measureMs(() => new WebIO().readBinary(bytes), RUNS, WARMUPS);
  const checkedRead = await measureMs(() => readAsset(sourceOf(bytes)), RUNS, WARMUPS);
  // As lintAsset reads: keyframes viewed in place instead of copied (read/keyframe-views.ts).
  const inPlaceRead = await measureMs(() => readAsset(sourceOf(bytes), { viewKeyframes: true }), RUNS, WARMUPS);
  let findingCount = 0;
  const wholeLint = await measureMs(
    async () => {
      findingCount = (await lintAsset(sourceOf(bytes), policy)).findings.length;
    },
    RUNS,
    WARMUPS
  );

  const { document } = await readAsset(sourceOf(bytes));
  const channelRead = await measureMs(() => readRotationChannels(document), RUNS, WARMUPS);
  const factsRead = await measureMs(() => readAssetFacts(document), RUNS, WARMUPS);
  let channels = readRotationChannels(document);
  let facts = readAssetFacts(document);
  const keyCount = channels.reduce((sum, channel) => sum + channel.keyCount, 0);
  // Fresh channel objects before every timed rule pass: rules cache work per channel object, and
  // a pass over channels they have already seen would time cache hits, not linting.
  const freshChannels = () => {
    channels = readRotationChannels(document);
    facts = readAssetFacts(document);
  };
  let floorSum = 0;
  const bareRead = await measureMs(() => (floorSum += readEveryKey(channels)), RUNS, WARMUPS, freshChannels);
  const cheapestTests = await measureMs(() => (floorSum += cheapestKeyTests(channels)), RUNS, WARMUPS, freshChannels);
  // The pass lintAsset runs (lint-document.ts), findings and all.
  const rulePass = await measureMs(() => runRules(channels, facts, ASSET_PATH, policy), RUNS, WARMUPS, freshChannels);
  const perRule: BenchRow[] = [];
  for (const rule of RULES) {
    const timing = await measureMs(() => runRules(channels, facts, ASSET_PATH, policy, [rule]), 5, 1, freshChannels);
    perRule.push({
      measure: `  ${rule.id}`,
      value: `${formatTiming(timing)}, ${formatRate(keyCount, timing.medianMs)}`
    });
  }

  process.stderr.write('Measuring peak memory in a fresh process...\n');
  const memory = runMemoryProbe();

  const ratio = wholeLint.medianMs / readAlone.medianMs;
  const keysPerSecond = keyCount / (rulePass.medianMs / 1000);
  const memoryTarget = 2 * asset.bytes.byteLength + TARGET_MEMORY_SLACK_BYTES;
  const rows: BenchRow[] = [
    { measure: 'File size', value: formatMegabytes(asset.bytes.byteLength) },
    {
      measure: 'Rotation keys',
      value: `${keyCount.toLocaleString('en-US')} (${asset.linearChannels} LINEAR + ${asset.cubicChannels} CUBICSPLINE channels)`
    },
    { measure: 'Read alone (@gltf-transform/core readBinary)', value: formatTiming(readAlone) },
    { measure: 'Checked read (readAsset)', value: formatTiming(checkedRead) },
    { measure: 'Checked read, keyframes in place (as lintAsset reads)', value: formatTiming(inPlaceRead) },
    { measure: 'Channel extraction (readRotationChannels)', value: formatTiming(channelRead) },
    { measure: 'Node and skin facts (readAssetFacts)', value: formatTiming(factsRead) },
    {
      measure: 'Floor: a loop that only reads every key (values, and tangents on CUBICSPLINE)',
      value: `${formatTiming(bareRead)}, ${formatRate(keyCount, bareRead.medianMs)}`
    },
    {
      measure: 'Floor: the cheapest tests per key (length², dot with the key before, four comparisons)',
      value: `${formatTiming(cheapestTests)}, ${formatRate(keyCount, cheapestTests.medianMs)}`
    },
    { measure: 'Rule pass (all rules, as lintAsset runs it)', value: formatTiming(rulePass) },
    { measure: 'Whole lint (lintAsset)', value: `${formatTiming(wholeLint)}, ${findingCount} findings` },
    { measure: 'Whole lint, first in a fresh process (cold JIT)', value: `${memory.coldLintMs.toFixed(1)} ms` },
    {
      measure: 'Reading side (checked read in place + extraction + facts) / read alone',
      value: `${((inPlaceRead.medianMs + channelRead.medianMs + factsRead.medianMs) / readAlone.medianMs).toFixed(2)}×`
    },
    {
      measure: 'Whole lint / read alone',
      value:
        `${ratio.toFixed(2)}× (fastest runs: ${(wholeLint.minMs / readAlone.minMs).toFixed(2)}×, ` +
        `CPU: ${(wholeLint.cpuMedianMs / readAlone.cpuMedianMs).toFixed(2)}×)`,
      target: `≤ ${TARGET_RATIO}×`,
      isMet: ratio <= TARGET_RATIO
    },
    {
      measure: 'Rule pass speed',
      value:
        `${formatRate(keyCount, rulePass.medianMs)} (fastest run: ${formatRate(keyCount, rulePass.minMs)}, ` +
        `CPU: ${formatRate(keyCount, rulePass.cpuMedianMs)})`,
      target: `≥ ${(TARGET_KEYS_PER_SECOND / 1e6).toFixed(0)} M keys/s (${((keyCount / TARGET_KEYS_PER_SECOND) * 1000).toFixed(0)} ms here)`,
      isMet: keysPerSecond >= TARGET_KEYS_PER_SECOND
    },
    {
      measure: 'Peak memory (OS peak RSS, fresh process)',
      value: formatMegabytes(memory.peakRssBytes),
      target: `≤ ${formatMegabytes(memoryTarget)} (2 × file + 150 MB)`,
      isMet: memory.peakRssBytes <= memoryTarget
    },
    {
      measure: 'RSS sampled before / after lint',
      value: `${formatMegabytes(memory.rssBefore)} / ${formatMegabytes(memory.rssAfter)}`
    },
    {
      measure: 'Heap used / external+arrayBuffers after lint',
      value: `${formatMegabytes(memory.heapUsed)} / ${formatMegabytes(memory.external)}`
    }
  ];

  const machine = `Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, load average ${loadavg()[0].toFixed(1)}`;
  const title =
    `Orientry lint engine: ${JOINTS} joints × ${KEYS_PER_JOINT.toLocaleString('en-US')} keys; median of ${RUNS} runs ` +
    `after ${WARMUPS} warm-ups, fastest in parentheses (${machine})`;
  process.stdout.write(
    `${formatTable(title, rows)}\n\nPer rule alone (median of 5; a rule alone also pays for any per-channel work rules share):\n`
  );
  process.stdout.write(`${formatTable('', perRule).split('\n').slice(4).join('\n')}\n\n`);
  process.stdout.write(`Markdown for README:\n\n${formatMarkdownTable(rows)}\n`);
}

/**
 * Sums every float the rule pass has to look at, and nothing else: the time any pass over the
 * keys pays at least, whatever it computes. Returns the sum so the loop cannot be dropped.
 */
function readEveryKey(channels: readonly RotationChannel[]): number {
  let sum = 0;
  for (const channel of channels) {
    sum += sumFloats(channel.values, channel.keyCount);
    if (channel.inTangents !== null) sum += sumFloats(channel.inTangents, channel.keyCount);
    if (channel.outTangents !== null) sum += sumFloats(channel.outTangents, channel.keyCount);
  }
  return sum;
}

function sumFloats(array: Float32Array, keyCount: number): number {
  let sum = 0;
  for (let offset = 0; offset < keyCount * 4; offset += 4) {
    sum += array[offset] + array[offset + 1] + array[offset + 2] + array[offset + 3];
  }
  return sum;
}

/**
 * A lower bound for any rule pass that looks at every key: each key's squared length and its dot
 * product with the key before, compared with four thresholds (drift, hemisphere, arc, repeat),
 * counting the keys that fail one. No rule is this cheap: they also need times, tangents,
 * speeds and interpolation. Returns the count so the loop cannot be dropped.
 */
function cheapestKeyTests(channels: readonly RotationChannel[]): number {
  let flagged = 0;
  for (const channel of channels) flagged += countCheapFailures(channel.values, channel.keyCount);
  return flagged;
}

function countCheapFailures(values: Float32Array, keyCount: number): number {
  let failures = 0;
  let x1 = values[0];
  let y1 = values[1];
  let z1 = values[2];
  let w1 = values[3];
  let length1 = x1 * x1 + y1 * y1 + z1 * z1 + w1 * w1;
  for (let offset = 4; offset < keyCount * 4; offset += 4) {
    const x = values[offset];
    const y = values[offset + 1];
    const z = values[offset + 2];
    const w = values[offset + 3];
    const length = x * x + y * y + z * z + w * w;
    const dot = x1 * x + y1 * y + z1 * z + w1 * w;
    const dotSquared = dot * dot;
    const lengthProduct = length * length1;
    if (
      !(length > 0.998 && length < 1.002) ||
      dot < 0 ||
      dotSquared < 0.067 * lengthProduct ||
      dotSquared > 0.99999 * lengthProduct
    ) {
      failures++;
    }
    x1 = x;
    y1 = y;
    z1 = z;
    w1 = w;
    length1 = length;
  }
  return failures;
}

interface MemoryReport {
  peakRssBytes: number;
  rssBefore: number;
  rssAfter: number;
  heapUsed: number;
  external: number;
  /** The one lint of the probe: the first in its process, before V8 has compiled the hot loops. */
  coldLintMs: number;
}

function runMemoryProbe(): MemoryReport {
  const child = spawnSync(process.execPath, ['--expose-gc', process.argv[1], '--memory-probe', GLB_PATH], {
    encoding: 'utf8'
  });
  if (child.status !== 0) throw new Error(`memory probe failed: ${child.stderr}`);
  return JSON.parse(child.stdout) as MemoryReport;
}

/** Child-process mode: load the file, lint it once, report memory as JSON on stdout. */
async function probeMemory(path: string): Promise<void> {
  // A Buffer is a Uint8Array: one copy of the file in memory, as a server holding an upload has.
  const bytes = readFileSync(path);
  collectGarbage();
  const rssBefore = process.memoryUsage().rss;
  let rssPeakSampled = rssBefore;
  // Samples land only between awaits, so they complement the OS peak rather than replace it.
  const sampler = setInterval(() => (rssPeakSampled = Math.max(rssPeakSampled, process.memoryUsage().rss)), 1);
  const coldLintMs = await timeOnce(() => lintAsset(sourceOf(bytes), policy));
  clearInterval(sampler);
  const usage = process.memoryUsage();
  const report: MemoryReport = {
    // resourceUsage().maxRSS is the kernel's peak resident set of this process, in kilobytes.
    peakRssBytes: Math.max(process.resourceUsage().maxRSS * 1024, rssPeakSampled, usage.rss),
    rssBefore,
    rssAfter: usage.rss,
    heapUsed: usage.heapUsed,
    external: usage.external + usage.arrayBuffers,
    coldLintMs
  };
  process.stdout.write(JSON.stringify(report));
}

function formatRate(keyCount: number, milliseconds: number): string {
  return `${(keyCount / milliseconds / 1000).toFixed(0)} M keys/s`;
}

/**
 * Engine benchmark: how much linting adds on top of merely reading a large animated GLB.
 *
 * Generates a 200-joint rig with 10,000 rotation keys per joint (2 million keys, LINEAR and
 * CUBICSPLINE mixed, with defects), then measures in this process:
 * - @gltf-transform/core alone reading the GLB (`WebIO.readBinary`), the floor any lint pays;
 * - the whole lint (`lintAsset`: checked read, channel and fact extraction, every rule);
 * - the rule pass alone over already-read channels, as keys per second, with a per-rule breakdown;
 * and, in a fresh child process that only loads the file and lints it once, the peak memory
 * (the OS peak RSS, plus RSS sampled between phases and process.memoryUsage()).
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
  severityFor,
  type Finding,
  type RuleContext
} from '$lib/lint/index';
import { buildEngineAsset } from './support/engine-asset';
import {
  collectGarbage,
  formatMarkdownTable,
  formatMegabytes,
  formatTable,
  medianMs,
  timeOnce,
  type BenchRow
} from './support/measure';

const JOINTS = 200;
const KEYS_PER_JOINT = 10_000;
const CUBIC_EVERY = 4;
const RUNS = 9;
const GLB_PATH = 'bench-output/lint-engine.glb';
const TARGET_RATIO = 1.25;
const TARGET_KEYS_PER_SECOND = 100e6;
const TARGET_MEMORY_SLACK_BYTES = 150 * 2 ** 20;

const policy = parsePolicy({});
const sourceOf = (bytes: Uint8Array) => ({
  path: 'tidewatch/deckhand.glb',
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
  const readAloneMs = await medianMs(() => new WebIO().readBinary(bytes), RUNS);
  const checkedReadMs = await medianMs(() => readAsset(sourceOf(bytes)), RUNS);
  let findingCount = 0;
  const wholeLintMs = await medianMs(async () => {
    findingCount = (await lintAsset(sourceOf(bytes), policy)).findings.length;
  }, RUNS);

  const { document } = await readAsset(sourceOf(bytes));
  const channelReadMs = await medianMs(() => readRotationChannels(document), RUNS);
  const factsReadMs = await medianMs(() => readAssetFacts(document), RUNS);
  let channels = readRotationChannels(document);
  let facts = readAssetFacts(document);
  const keyCount = channels.reduce((sum, channel) => sum + channel.keyCount, 0);
  // Fresh channel objects before every timed rule pass: rules may cache work per channel object,
  // and a pass over channels they have already seen would time cache hits, not linting.
  const freshChannels = () => {
    channels = readRotationChannels(document);
    facts = readAssetFacts(document);
  };

  const runRules = (rules: typeof RULES) => {
    const findings: Finding[] = [];
    for (const rule of rules) {
      const severity = severityFor(policy, rule.id, rule.defaultSeverity);
      if (severity === 'off') continue;
      const context: RuleContext = {
        asset: 'deckhand.glb',
        policy,
        severity,
        emit: () => findings.push({} as Finding)
      };
      if (rule.scope === 'channel') for (const channel of channels) rule.check(channel, context);
      else rule.check(facts, channels, context);
    }
    return findings.length;
  };
  const rulePassMs = await medianMs(() => runRules(RULES), RUNS, 2, freshChannels);
  const perRule: BenchRow[] = [];
  for (const rule of RULES) {
    const ms = await medianMs(() => runRules([rule]), 5, 1, freshChannels);
    perRule.push({ measure: `  ${rule.id}`, value: `${ms.toFixed(1)} ms (${formatRate(keyCount / (ms / 1000))})` });
  }

  process.stderr.write('Measuring peak memory in a fresh process...\n');
  const memory = runMemoryProbe();

  const ratio = wholeLintMs / readAloneMs;
  const keysPerSecond = keyCount / (rulePassMs / 1000);
  const memoryTarget = 2 * asset.bytes.byteLength + TARGET_MEMORY_SLACK_BYTES;
  const rows: BenchRow[] = [
    { measure: 'File size', value: formatMegabytes(asset.bytes.byteLength) },
    {
      measure: 'Rotation keys',
      value: `${keyCount.toLocaleString('en-US')} (${asset.linearChannels} LINEAR + ${asset.cubicChannels} CUBICSPLINE channels)`
    },
    { measure: 'Read alone (@gltf-transform/core readBinary)', value: `${readAloneMs.toFixed(1)} ms` },
    { measure: 'Checked read (readAsset)', value: `${checkedReadMs.toFixed(1)} ms` },
    { measure: 'Channel extraction (readRotationChannels)', value: `${channelReadMs.toFixed(1)} ms` },
    { measure: 'Node and skin facts (readAssetFacts)', value: `${factsReadMs.toFixed(1)} ms` },
    { measure: 'Rule pass (all rules)', value: `${rulePassMs.toFixed(1)} ms` },
    { measure: 'Whole lint (lintAsset)', value: `${wholeLintMs.toFixed(1)} ms, ${findingCount} findings` },
    {
      measure: 'Reading side (checked read + extraction + facts) / read alone',
      value: `${((checkedReadMs + channelReadMs + factsReadMs) / readAloneMs).toFixed(2)}×`
    },
    {
      measure: 'Whole lint / read alone',
      value: `${ratio.toFixed(2)}×`,
      target: `≤ ${TARGET_RATIO}×`,
      isMet: ratio <= TARGET_RATIO
    },
    {
      measure: 'Rule pass speed',
      value: formatRate(keysPerSecond),
      target: `≥ ${formatRate(TARGET_KEYS_PER_SECOND)}`,
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
  const title = `Orientry lint engine: ${JOINTS} joints × ${KEYS_PER_JOINT.toLocaleString('en-US')} keys, median of ${RUNS} runs (${machine})`;
  process.stdout.write(
    `${formatTable(title, rows)}\n\nPer rule alone (median of 5; a rule alone also pays for any per-channel work rules share):\n`
  );
  process.stdout.write(`${formatTable('', perRule).split('\n').slice(4).join('\n')}\n\n`);
  process.stdout.write(`Markdown for README:\n\n${formatMarkdownTable(rows)}\n`);
}

interface MemoryReport {
  peakRssBytes: number;
  rssBefore: number;
  rssAfter: number;
  heapUsed: number;
  external: number;
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
  await timeOnce(() => lintAsset(sourceOf(bytes), policy));
  clearInterval(sampler);
  const usage = process.memoryUsage();
  const report: MemoryReport = {
    // resourceUsage().maxRSS is the kernel's peak resident set of this process, in kilobytes.
    peakRssBytes: Math.max(process.resourceUsage().maxRSS * 1024, rssPeakSampled, usage.rss),
    rssBefore,
    rssAfter: usage.rss,
    heapUsed: usage.heapUsed,
    external: usage.external + usage.arrayBuffers
  };
  process.stdout.write(JSON.stringify(report));
}

function formatRate(keysPerSecond: number): string {
  return `${(keysPerSecond / 1e6).toFixed(0)} M keys/s`;
}

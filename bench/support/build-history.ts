/**
 * A large invented build history for the query benchmark, written straight into the database
 * with bulk inserts through the models (ingesting it through the API would take hours): one
 * project "Tidewatch" of Lanternfish Interactive with a long run of builds, each of many assets,
 * and findings spread over them the way a real history has them (most on a few troubled rigs,
 * most unchanged from the baseline, a few new, fixed or waived). A deterministic random source
 * makes every run seed the same rows.
 */
import crypto from 'node:crypto';
import type { InferCreationAttributes } from 'sequelize';
import { RULE_IDS } from '$lib/lint/rule-ids';
import { ENGINE_VERSION } from '$lib/lint/version';
import { hashPassword } from '$lib/server/auth/password';
import type { Database } from '$lib/server/db/instance';
import { Asset, Build, FindingRecord, Project, ProjectMembership, User } from '$lib/server/db/models';
import * as apiTokens from '$lib/server/tokens/api-tokens';

/** How big a history to seed. */
export interface HistorySize {
  builds: number;
  assetsPerBuild: number;
  findings: number;
}

/** What the bench needs to reach the seeded data. */
export interface SeededHistory {
  projectSlug: string;
  /** Ids of the seeded builds, oldest first. */
  buildIds: number[];
  viewer: { email: string; password: string };
  /** A submit token of the project. */
  secret: string;
}

const PROJECT_SLUG = 'tidewatch';
const POLICY_VERSION = 'bench0000policy1';
const FOLDERS = ['chars', 'props', 'env', 'fx'];
const RULES = RULE_IDS.filter((rule) => rule !== 'asset-unreadable');
const HOUR_MS = 3_600_000;
/** Rows per INSERT: large enough to be fast, small enough for any driver's statement size. */
const CHUNK_ROWS = 2_000;

/** Seeds the history into `database` (migrated, empty) and resolves to how to reach it. */
export async function seedBuildHistory(database: Database, size: HistorySize): Promise<SeededHistory> {
  const random = seededRandom(20_260_501);
  const viewer = { email: 'mira.okafor@lanternfish.example', password: 'tidewatch-bench-viewer' };
  const user = await User.create({
    email: viewer.email,
    name: 'Mira Okafor',
    role: 'viewer',
    passwordHash: await hashPassword(viewer.password)
  });
  const project = await Project.create({ slug: PROJECT_SLUG, name: 'Tidewatch', baseBranch: 'main' });
  await ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'viewer' });
  const { secret } = await apiTokens.create(project.id, 'Bench CI', null);

  const findingsPerBuild = spreadFindings(size);
  const startedAt = Date.now() - size.builds * 2.5 * HOUR_MS;
  const builds: InferCreationAttributes<Build>[] = [];
  const assets: InferCreationAttributes<Asset>[] = [];
  const findings: InferCreationAttributes<FindingRecord>[] = [];
  let lastMainBuildId: number | null = null;
  for (let buildIndex = 0; buildIndex < size.builds; buildIndex++) {
    const buildId = buildIndex + 1;
    const branch = buildIndex % 5 === 4 ? `feature/rig-fix-${buildIndex}` : 'main';
    const firstAssetId = buildIndex * size.assetsPerBuild + 1;
    const counts = { error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 };
    const assetCounts = new Map<number, { error: number; warning: number; info: number; worstRule: string }>();
    for (let index = 0; index < findingsPerBuild[buildIndex]; index++) {
      // Four in five findings sit on the first 30 assets: the troubled rigs of the project.
      const assetIndex = random() < 0.8 ? Math.floor(random() * 30) : Math.floor(random() * size.assetsPerBuild);
      const rule = RULES[Math.floor(random() * RULES.length)];
      const roll = random();
      const severity = roll < 0.2 ? 'error' : roll < 0.7 ? 'warning' : 'info';
      const statusRoll = random();
      const status = statusRoll < 0.15 ? 'new' : statusRoll < 0.9 ? 'unchanged' : 'fixed';
      const waived = status !== 'fixed' && random() < 0.05;
      const keyFirst = Math.floor(random() * 400);
      findings.push({
        id: findings.length + 1,
        buildId,
        assetId: firstAssetId + assetIndex,
        assetPath: assetPath(assetIndex),
        rule,
        severity,
        status,
        waived,
        waiverId: null,
        animation: ['Swim', 'Idle', 'Climb', 'Dive'][assetIndex % 4],
        channel: assetIndex % 12,
        node: `Root/Spine/Arm_${assetIndex % 2 === 0 ? 'L' : 'R'}/Hand`,
        keyFirst,
        keyLast: keyFirst + Math.floor(random() * 4),
        timeSeconds: keyFirst / 30,
        valuesJson: JSON.stringify({ angleDegrees: Math.round(random() * 1800) / 10 }),
        message: `Rotation keys ${keyFirst} to ${keyFirst + 1} of ${assetPath(assetIndex)} break the ${rule} rule.`,
        hint: `Run orientry fix on ${assetPath(assetIndex)}, or re-export the clip.`,
        fingerprint: crypto.createHash('md5').update(`${assetIndex}:${rule}:${keyFirst}`).digest('hex')
      });
      if (status === 'fixed') counts.fixed++;
      else if (waived) counts.waived++;
      else {
        counts[severity]++;
        counts[status]++;
        const open = assetCounts.get(assetIndex) ?? { error: 0, warning: 0, info: 0, worstRule: rule };
        open[severity]++;
        assetCounts.set(assetIndex, open);
      }
    }
    for (let assetIndex = 0; assetIndex < size.assetsPerBuild; assetIndex++) {
      const open = assetCounts.get(assetIndex);
      // An asset changes now and then; most builds re-send most files unchanged.
      const revision = Math.floor(buildIndex / (7 + (assetIndex % 23)));
      assets.push({
        id: firstAssetId + assetIndex,
        buildId,
        path: assetPath(assetIndex),
        contentHash: crypto.createHash('sha256').update(`${assetIndex}:${revision}`).digest('hex'),
        byteLength: 40_000 + ((assetIndex * 7919) % 2_000_000),
        policyVersion: POLICY_VERSION,
        unreadable: false,
        statsJson: JSON.stringify({
          animations: 1 + (assetIndex % 4),
          rotationChannels: 8 + (assetIndex % 40),
          rotationKeys: 240 + ((assetIndex * 37) % 4000),
          nodesWithRotation: 12 + (assetIndex % 60)
        }),
        errorCount: open?.error ?? 0,
        warningCount: open?.warning ?? 0,
        infoCount: open?.info ?? 0,
        worstRule: open?.worstRule ?? null
      });
    }
    const isFailed = counts.new > 0 && counts.error > 0;
    builds.push({
      id: buildId,
      projectId: project.id,
      branch,
      commitSha: crypto.createHash('sha1').update(String(buildIndex)).digest('hex'),
      label: `#${1000 + buildIndex}`,
      ciJobUrl: null,
      idempotencyKey: `history-${buildIndex}`,
      verdict: isFailed ? 'fail' : 'pass',
      verdictReason: isFailed ? `${counts.new} new findings, errors among them` : 'No new errors.',
      baselineBuildId: lastMainBuildId,
      policyVersion: POLICY_VERSION,
      engineVersion: ENGINE_VERSION,
      errorCount: counts.error,
      warningCount: counts.warning,
      infoCount: counts.info,
      newCount: counts.new,
      unchangedCount: counts.unchanged,
      fixedCount: counts.fixed,
      waivedCount: counts.waived,
      assetCount: size.assetsPerBuild,
      durationMs: 900 + Math.floor(random() * 4000),
      createdAt: new Date(startedAt + buildIndex * 2.5 * HOUR_MS)
    });
    if (branch === 'main') lastMainBuildId = buildId;
  }

  await insertInChunks(database, Build, builds);
  await insertInChunks(database, Asset, assets);
  await insertInChunks(database, FindingRecord, findings);
  if (database.location.dialect === 'postgres') {
    // Rows were inserted with their ids; move each id sequence past them for later inserts.
    for (const table of ['builds', 'assets', 'findings']) {
      await database.sequelize.query(
        `SELECT setval(pg_get_serial_sequence('"${table}"', 'id'), (SELECT MAX("id") FROM "${table}"))`
      );
    }
    await database.sequelize.query('ANALYZE');
  }
  return { projectSlug: PROJECT_SLUG, buildIds: builds.map((build) => build.id!), viewer, secret };
}

/** Findings per build, varying from 10 to 90 around the mean, summing to exactly `size.findings`. */
function spreadFindings(size: HistorySize): number[] {
  const mean = size.findings / size.builds;
  const counts = Array.from({ length: size.builds }, (_, index) =>
    Math.max(0, Math.round(mean + ((index % 5) - 2) * (mean * 0.4)))
  );
  let excess = counts.reduce((sum, count) => sum + count, 0) - size.findings;
  for (let index = counts.length - 1; excess !== 0; index = (index - 1 + counts.length) % counts.length) {
    const step = excess > 0 ? Math.min(excess, counts[index]) : excess;
    counts[index] -= step;
    excess -= step;
  }
  return counts;
}

function assetPath(assetIndex: number): string {
  return `${FOLDERS[assetIndex % FOLDERS.length]}/asset-${String(assetIndex).padStart(3, '0')}.glb`;
}

async function insertInChunks<Row extends object>(
  database: Database,
  model: { bulkCreate(rows: Row[], options: object): Promise<unknown> },
  rows: Row[]
): Promise<void> {
  for (let start = 0; start < rows.length; start += CHUNK_ROWS) {
    await database.sequelize.transaction(async (transaction) => {
      await model.bulkCreate(rows.slice(start, start + CHUNK_ROWS), { transaction, validate: false });
    });
  }
}

/** Mulberry32, a small seeded random source: the same rows on every run. */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/**
 * Turns one build upload into a stored build: receive the files to a temporary folder, lint
 * them (or reuse earlier lints), compare with the baseline, apply waivers, decide the verdict,
 * store the files as blobs, and write every row in one short transaction. A build is either
 * wholly stored or not at all, also when the process dies half-way: nothing is written to the
 * database before the transaction, and SQLite's journal undoes an unfinished one.
 */
import fs from 'node:fs';
import path from 'node:path';
import pLimit from 'p-limit';
import { UniqueConstraintError } from 'sequelize';
import type { AssetReport } from '../../lint/lint-report';
import { policyVersionOf } from '../../lint/policy';
import { ENGINE_VERSION } from '../../lint/version';
import { findProjectPolicy } from '../builds/find-project-policy';
import { findFindingsById, type StandingEntry } from '../builds/find-standing-findings';
import { getConfig } from '../config';
import { getDatabase } from '../db/instance';
import { Build, Waiver, type Project } from '../db/models';
import { ApiError } from './api-error';
import { prefetchBaseline } from './baseline-prefetch';
import { storeBlob } from './blob-store';
import { parseBuildMeta, type BuildMeta } from './build-meta';
import { deriveIdempotencyKey } from './derived-idempotency-key';
import { discardBody } from './discard-body';
import { prepareFindingRowValues } from './finding-row-values';
import { agreedIdempotencyKey, IDEMPOTENCY_HEADER, parseIdempotencyHeader } from './idempotency-key';
import { getIngestLimits } from './limits';
import { isAssetFile } from './lint-upload';
import { fixedBaselineFindings, planBuild, type PlanBaseline } from './plan-build';
import { DRAIN_EXTRA_BYTES, receiveUpload, type ReceivedFile } from './receive-upload';
import { withUploadFolder } from './upload-folder';
import { createUploadLinter } from './upload-linter';
import { writeBuild, type BuildRow } from './write-build';

/** Blobs moved into the store at once: enough to hide the disk's latency, well below file limits. */
const BLOB_MOVES_AT_ONCE = 8;

/** A stored build, and whether it existed already (a repeated idempotency key). */
export interface IngestResult {
  build: Build;
  isExisting: boolean;
}

/**
 * Ingests the multipart build upload of `request` for `project` (already authorized).
 *
 * A repeated upload is answered early: when the `Idempotency-Key` header equals the key of a
 * stored build of the project, that build is the answer before a byte of the body is read. The
 * key in `meta` stays the one stored with a new build (the header's when meta has none); when
 * both are sent they must be equal.
 * @param origin public origin of the server, for the report URL handed to hooks.
 * @throws ApiError for every problem with the upload (400, 413), including 400
 *   `upload.idempotency-key-invalid` and `upload.idempotency-mismatch`.
 */
export async function ingestBuild(project: Project, request: Request, origin: string): Promise<IngestResult> {
  const startedAtMs = Date.now();
  const limits = getIngestLimits();
  const headerKey = parseIdempotencyHeader(request.headers.get(IDEMPOTENCY_HEADER));
  const known = await findByIdempotencyKey(project.id, headerKey);
  if (known) {
    // Not awaited on purpose: the answer goes out now while the unneeded rest of the body is
    // dropped behind it. discardBody never rejects.
    void discardBody(request, limits.maxBuildBytes + DRAIN_EXTRA_BYTES);
    return { build: known, isExisting: true };
  }

  const { dataDir } = getConfig();
  const policy = await findProjectPolicy(project.id);
  const policyVersion = policyVersionOf(policy);
  const baselines = prefetchBaseline(project);
  return withUploadFolder(dataDir, async (folder) => {
    const filesFolder = path.join(folder, 'files');
    await fs.promises.mkdir(filesFolder);
    // Assets are linted as they arrive; the folder must outlive every lint, whatever happens.
    const { sequelize } = getDatabase();
    const linter = createUploadLinter(filesFolder, policy, policyVersion, (asset) =>
      prepareFindingRowValues(sequelize, asset.report.findings)
    );
    try {
      return await storeUpload();
    } finally {
      await linter.settle();
    }

    async function storeUpload(): Promise<IngestResult> {
      const upload = await receiveUpload(request, filesFolder, limits, { onFileReceived: linter.received });
      const meta = parseBuildMeta(upload.metaText);
      const idempotencyKey =
        agreedIdempotencyKey(headerKey, meta.idempotencyKey) ??
        (meta.deriveIdempotencyKey ? derivedKeyOf(project, meta, upload.files) : null);

      const existing = await findByIdempotencyKey(project.id, idempotencyKey);
      if (existing) return { build: existing, isExisting: true };
      if (!upload.files.some((file) => isAssetFile(file.path))) throw noAssets(upload.files);

      const builtAt = meta.builtAt ?? new Date();
      // The baseline and the waivers are read while the last assets are still being linted.
      const [linted, { build: baseline, findings: baselineFindings }, waivers] = await Promise.all([
        linter.finish(upload.files),
        baselines.baselineAt(builtAt),
        Waiver.findAll({ where: { projectId: project.id, status: 'approved' } })
      ]);
      const checked = linted.filter((asset) => !asset.report.skipped);
      const reports = checked.map((asset) => asset.report);
      const plan = planBuild(
        reports,
        baselineFindings && (await wholeFixedFindings(reports, baselineFindings)),
        waivers,
        policy,
        builtAt
      );

      // Blobs go first: a stored build must never point at a missing blob, while a blob no build
      // points at (the transaction below failed) is harmless and reused by the next upload.
      // A few at a time: one after another, 50 files took 10–40 ms of waits on the disk.
      const limit = pLimit(BLOB_MOVES_AT_ONCE);
      await Promise.all(upload.files.map((file) => limit(() => storeBlob(dataDir, file.sha256, file.diskPath))));

      const row: BuildRow = {
        projectId: project.id,
        branch: meta.branch,
        commitSha: meta.commit ?? null,
        label: meta.label ?? null,
        ciJobUrl: meta.ciJobUrl ?? null,
        idempotencyKey,
        baselineBuildId: baseline?.id ?? null,
        policyVersion,
        engineVersion: ENGINE_VERSION,
        durationMs: Date.now() - startedAtMs,
        createdAt: builtAt
      };
      try {
        const build = await writeBuild(project, row, plan, checked, origin);
        return { build, isExisting: false };
      } catch (error) {
        // Two uploads with one key raced past the check above: the first one's build is the answer.
        const winner =
          error instanceof UniqueConstraintError && (await findByIdempotencyKey(project.id, idempotencyKey));
        if (winner) return { build: winner, isExisting: true };
        throw error;
      }
    }
  });
}

/** The baseline for planBuild, with the findings this build fixes read whole (the rest need not be). */
async function wholeFixedFindings(
  reports: readonly AssetReport[],
  baselineFindings: readonly StandingEntry[]
): Promise<PlanBaseline<StandingEntry>> {
  const fixed = await findFindingsById(fixedBaselineFindings(reports, baselineFindings).map((entry) => entry.id));
  return {
    findings: baselineFindings,
    fixedFinding: (entry) => {
      const finding = fixed.get(entry.id);
      // Stored builds are never edited, so only a deletion during the upload gets here.
      if (!finding) throw new Error(`baseline finding ${entry.id} disappeared while the build was compared with it`);
      return finding;
    }
  };
}

/** The key derived from where the build comes from and what it holds (derived-idempotency-key.ts). */
function derivedKeyOf(project: Project, meta: BuildMeta, files: readonly ReceivedFile[]): string {
  return deriveIdempotencyKey({
    project: project.slug,
    branch: meta.branch,
    commit: meta.commit ?? null,
    label: meta.label ?? null,
    files: files.map((file) => ({ uploadPath: file.path, sha256: file.sha256 }))
  });
}

async function findByIdempotencyKey(projectId: number, key: string | null | undefined): Promise<Build | null> {
  if (!key) return null;
  return Build.findOne({ where: { projectId, idempotencyKey: key } });
}

function noAssets(files: readonly ReceivedFile[]): ApiError {
  const names = files
    .slice(0, 3)
    .map((file) => `"${file.path}"`)
    .join(', ');
  return new ApiError(
    400,
    'upload.no-assets',
    `file: none of the ${files.length} files is a .glb or .gltf asset (got ${names}${files.length > 3 ? ', …' : ''}). ` +
      'Send the assets themselves; side files (.bin, images) only come along with them.'
  );
}

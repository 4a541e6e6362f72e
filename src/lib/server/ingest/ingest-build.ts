/**
 * Turns one build upload into a stored build: receive the files to a temporary folder, lint
 * them (or reuse earlier lints), compare with the baseline, apply waivers, decide the verdict,
 * store the files as blobs, and write every row in one short transaction. A build is either
 * wholly stored or not at all, also when the process dies half-way: nothing is written to the
 * database before the transaction, and SQLite's journal undoes an unfinished one.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Op, UniqueConstraintError, type InferCreationAttributes } from 'sequelize';
import { policyVersionOf } from '../../lint/policy';
import { ENGINE_VERSION } from '../../lint/version';
import { findBaselineBuild } from '../builds/find-baseline-build';
import { findProjectPolicy } from '../builds/find-project-policy';
import { findingColumnsOf, findingOf } from '../builds/finding-columns';
import { reportPathOf } from '../builds/build-summary';
import { getConfig } from '../config';
import { getDatabase } from '../db/instance';
import { Asset, Build, FindingRecord, Waiver, type Project } from '../db/models';
import { ApiError } from './api-error';
import { assetSideFiles } from './asset-side-file';
import { storeBlob } from './blob-store';
import { parseBuildMeta } from './build-meta';
import { agreedIdempotencyKey, IDEMPOTENCY_HEADER, parseIdempotencyHeader } from './idempotency-key';
import { runBuildStoredHooks } from './build-stored-hooks';
import { getIngestLimits } from './limits';
import { isAssetFile, lintUpload, type LintedAsset } from './lint-upload';
import { planBuild, type BuildPlan } from './plan-build';
import { receiveUpload, type ReceivedFile } from './receive-upload';
import { withUploadFolder } from './upload-folder';

/** A stored build, and whether it existed already (a repeated idempotency key). */
export interface IngestResult {
  build: Build;
  isExisting: boolean;
  /**
   * True when the `Idempotency-Key` header named a stored build and the answer comes before the
   * body was read: the route then closes the connection, since the rest of the body is still on it.
   */
  isBodyUnread: boolean;
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
  const headerKey = parseIdempotencyHeader(request.headers.get(IDEMPOTENCY_HEADER));
  const known = await findByIdempotencyKey(project.id, headerKey);
  if (known) return { build: known, isExisting: true, isBodyUnread: true };

  const { dataDir } = getConfig();
  const limits = getIngestLimits();
  return withUploadFolder(dataDir, async (folder) => {
    const filesFolder = path.join(folder, 'files');
    await fs.promises.mkdir(filesFolder);
    const upload = await receiveUpload(request, filesFolder, limits);
    const meta = parseBuildMeta(upload.metaText);
    const idempotencyKey = agreedIdempotencyKey(headerKey, meta.idempotencyKey);

    const existing = await findByIdempotencyKey(project.id, idempotencyKey);
    if (existing) return { build: existing, isExisting: true, isBodyUnread: false };
    if (!upload.files.some((file) => isAssetFile(file.path))) throw noAssets(upload.files);

    const policy = await findProjectPolicy(project.id);
    const policyVersion = policyVersionOf(policy);
    const linted = await lintUpload(upload.files, filesFolder, policy, policyVersion);
    const checked = linted.filter((asset) => !asset.report.skipped);

    const builtAt = meta.builtAt ?? new Date();
    const baseline = await findBaselineBuild(project, builtAt);
    const baselineFindings = baseline
      ? (
          await FindingRecord.findAll({
            where: { buildId: baseline.id, status: { [Op.in]: ['new', 'unchanged'] } },
            order: [['id', 'ASC']]
          })
        ).map(findingOf)
      : null;
    const waivers = await Waiver.findAll({ where: { projectId: project.id, status: 'approved' } });
    const plan = planBuild(
      checked.map((asset) => asset.report),
      baselineFindings,
      waivers,
      policy,
      builtAt
    );

    // Blobs go first: a stored build must never point at a missing blob, while a blob no build
    // points at (the transaction below failed) is harmless and reused by the next upload.
    for (const file of upload.files) await storeBlob(dataDir, file.sha256, file.diskPath);

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
      return { build, isExisting: false, isBodyUnread: false };
    } catch (error) {
      // Two uploads with one key raced past the check above: the first one's build is the answer.
      const winner = error instanceof UniqueConstraintError && (await findByIdempotencyKey(project.id, idempotencyKey));
      if (winner) return { build: winner, isExisting: true, isBodyUnread: false };
      throw error;
    }
  });
}

/** The columns of a build known before its plan. */
type BuildRow = Pick<
  InferCreationAttributes<Build>,
  | 'projectId'
  | 'branch'
  | 'commitSha'
  | 'label'
  | 'ciJobUrl'
  | 'idempotencyKey'
  | 'baselineBuildId'
  | 'policyVersion'
  | 'engineVersion'
  | 'durationMs'
  | 'createdAt'
>;

/** Writes the build, its assets, their side files and findings, and runs the hooks, in one transaction. */
async function writeBuild(
  project: Project,
  row: BuildRow,
  plan: BuildPlan,
  checked: readonly LintedAsset[],
  origin: string
): Promise<Build> {
  const { sequelize } = getDatabase();
  const sideFileModel = assetSideFiles();
  const sideFilesByPath = new Map(checked.map((asset) => [asset.file.path, asset]));
  return sequelize.transaction(async (transaction) => {
    const build = await Build.create(
      {
        ...row,
        verdict: plan.decision.verdict,
        verdictReason: plan.decision.reason,
        errorCount: plan.counts.error,
        warningCount: plan.counts.warning,
        infoCount: plan.counts.info,
        newCount: plan.counts.new,
        unchangedCount: plan.counts.unchanged,
        fixedCount: plan.counts.fixed,
        waivedCount: plan.counts.waived,
        assetCount: plan.assets.length
      },
      { transaction }
    );
    for (const planned of plan.assets) {
      const linted = sideFilesByPath.get(planned.report.path)!;
      const asset = await Asset.create(
        {
          buildId: build.id,
          path: planned.report.path,
          contentHash: linted.file.sha256,
          byteLength: planned.report.byteLength,
          policyVersion: row.policyVersion,
          unreadable: planned.report.unreadable,
          statsJson: JSON.stringify(planned.report.stats),
          errorCount: planned.counts.error,
          warningCount: planned.counts.warning,
          infoCount: planned.counts.info,
          worstRule: planned.worstRule
        },
        { transaction }
      );
      const sideFiles = Object.entries(linted.sideFiles).map(([sidePath, contentHash]) => ({
        assetId: asset.id,
        path: sidePath,
        contentHash
      }));
      if (sideFiles.length > 0) await sideFileModel.bulkCreate(sideFiles, { transaction });
      if (planned.findings.length > 0) {
        await FindingRecord.bulkCreate(
          planned.findings.map(({ finding, status, waiverId }) => ({
            ...findingColumnsOf(finding),
            buildId: build.id,
            assetId: asset.id,
            status,
            waived: waiverId !== null,
            waiverId
          })),
          { transaction }
        );
      }
    }
    await runBuildStoredHooks({
      project,
      build,
      plan,
      transaction,
      reportUrl: origin + reportPathOf(project.slug, build.id)
    });
    return build;
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

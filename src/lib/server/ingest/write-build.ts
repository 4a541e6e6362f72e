/**
 * Writing a planned build: the build row, its assets, the side files each asset read and the
 * findings, then the build-stored hooks, all in one transaction, so a build is stored whole or
 * not at all.
 *
 * Design notes: assets, side files and findings go in as plain multi-row INSERTs (a few
 * statements per build, see insert-rows.ts) rather than one `Model.create` per asset and a
 * `bulkCreate` per asset's findings. Building a model instance per row cost as much as the SQL
 * itself: with the 50 assets and 5,650 findings of bench/ingest.bench.ts, findings took about
 * 100 ms instead of 200 ms and assets a few ms instead of 50 to 150; value arrays instead of row
 * objects then took the whole write from about 190 ms to 130 ms. The rows are complete, so no model default is
 * missed, and asset ids are read back by path (paths are unique within a build).
 */
import type { InferCreationAttributes } from 'sequelize';
import { FINDING_COLUMN_NAMES } from '../builds/finding-columns';
import { reportPathOf } from '../builds/build-summary';
import { getDatabase } from '../db/instance';
import { insertRows } from '../db/insert-rows';
import { Asset, Build, FindingRecord, type Project } from '../db/models';
import { assetSideFiles } from './asset-side-file';
import { findingRowValues } from './finding-row-values';
import { runBuildStoredHooks } from './build-stored-hooks';
import { queueSqliteWrite } from './sqlite-write-queue';
import type { LintedAsset } from './lint-upload';
import type { BuildPlan } from './plan-build';

/** The columns of a build known before its plan. */
export type BuildRow = Pick<
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

/** The columns of an asset row written with a build, in the order {@link writeBuild} gives them. */
const ASSET_COLUMNS = [
  'buildId',
  'path',
  'contentHash',
  'byteLength',
  'policyVersion',
  'unreadable',
  'statsJson',
  'errorCount',
  'warningCount',
  'infoCount',
  'worstRule'
] as const satisfies readonly (keyof InferCreationAttributes<Asset>)[];

const SIDE_FILE_COLUMNS = ['assetId', 'path', 'contentHash'] as const;

/** A finding's own columns, then those of its place in the build. */
const FINDING_ROW_COLUMNS = [
  ...FINDING_COLUMN_NAMES,
  'buildId',
  'assetId',
  'status',
  'waived',
  'waiverId'
] as const satisfies readonly (keyof InferCreationAttributes<FindingRecord>)[];

/**
 * Writes the build and everything in its plan, and runs the build-stored hooks, in one transaction.
 * @param checked the linted assets of the plan (skipped ones left out), for their files and side files.
 * @param origin the server's public origin, for the report URL the hooks receive.
 */
export async function writeBuild(
  project: Project,
  row: BuildRow,
  plan: BuildPlan,
  checked: readonly LintedAsset[],
  origin: string
): Promise<Build> {
  const { sequelize } = getDatabase();
  const lintedByPath = new Map(checked.map((asset) => [asset.file.path, asset]));
  // Queued so concurrent uploads never wait for SQLite's lock inside threadpool threads.
  return queueSqliteWrite(sequelize, () =>
    sequelize.transaction(async (transaction) => {
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
      const assetRows = plan.assets.map((planned) => [
        build.id,
        planned.report.path,
        lintedByPath.get(planned.report.path)!.file.sha256,
        planned.report.byteLength,
        row.policyVersion,
        planned.report.unreadable,
        JSON.stringify(planned.report.stats),
        planned.counts.error,
        planned.counts.warning,
        planned.counts.info,
        planned.worstRule
      ]);
      await insertRows(sequelize, Asset.getTableName(), ASSET_COLUMNS, assetRows, transaction);
      const stored = await Asset.findAll({ where: { buildId: build.id }, attributes: ['id', 'path'], transaction });
      const assetIdByPath = new Map(stored.map((asset) => [asset.path, asset.id]));

      const sideFileRows = plan.assets.flatMap((planned) =>
        Object.entries(lintedByPath.get(planned.report.path)!.sideFiles).map(([sidePath, contentHash]) => [
          assetIdByPath.get(planned.report.path)!,
          sidePath,
          contentHash
        ])
      );
      await insertRows(sequelize, assetSideFiles().getTableName(), SIDE_FILE_COLUMNS, sideFileRows, transaction);

      const findingRows = plan.assets.flatMap((planned) => {
        const assetId = assetIdByPath.get(planned.report.path)!;
        return planned.findings.map(({ finding, status, waiverId }) => [
          findingRowValues(sequelize, finding),
          build.id,
          assetId,
          status,
          waiverId !== null,
          waiverId
        ]);
      });
      await insertRows(sequelize, FindingRecord.getTableName(), FINDING_ROW_COLUMNS, findingRows, transaction);

      await runBuildStoredHooks({
        project,
        build,
        plan,
        transaction,
        reportUrl: origin + reportPathOf(project.slug, build.id)
      });
      return build;
    })
  );
}

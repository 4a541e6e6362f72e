/**
 * Writing a planned build: the build row, its assets, the side files each asset read and the
 * findings, then the build-stored hooks, all in one transaction, so a build is stored whole or
 * not at all.
 *
 * Design notes: assets, side files and findings go in as plain multi-row INSERTs (a few
 * statements per build) rather than one `Model.create` per asset and a `bulkCreate` per asset's
 * findings. Building a model instance per row cost as much as the SQL itself: with the 50 assets
 * and 5,650 findings of bench/ingest.bench.ts, findings took about 100 ms instead of 200 ms and
 * assets a few ms instead of 50 to 150. The rows are complete, so no model default is missed,
 * and asset ids are read back by path (paths are unique within a build).
 */
import type { InferCreationAttributes } from 'sequelize';
import { findingColumnsOf } from '../builds/finding-columns';
import { reportPathOf } from '../builds/build-summary';
import { getDatabase } from '../db/instance';
import { Asset, Build, FindingRecord, type Project } from '../db/models';
import { assetSideFiles } from './asset-side-file';
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

/** Rows per INSERT statement: keeps each statement's SQL text to a few hundred kilobytes. */
const ROWS_PER_INSERT = 1000;

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
  const queryInterface = sequelize.getQueryInterface();
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
      const assetRows: Omit<InferCreationAttributes<Asset>, 'id'>[] = plan.assets.map((planned) => ({
        buildId: build.id,
        path: planned.report.path,
        contentHash: lintedByPath.get(planned.report.path)!.file.sha256,
        byteLength: planned.report.byteLength,
        policyVersion: row.policyVersion,
        unreadable: planned.report.unreadable,
        statsJson: JSON.stringify(planned.report.stats),
        errorCount: planned.counts.error,
        warningCount: planned.counts.warning,
        infoCount: planned.counts.info,
        worstRule: planned.worstRule
      }));
      for (const rows of chunks(assetRows))
        await queryInterface.bulkInsert(Asset.getTableName(), rows, { transaction });
      const stored = await Asset.findAll({ where: { buildId: build.id }, attributes: ['id', 'path'], transaction });
      const assetIdByPath = new Map(stored.map((asset) => [asset.path, asset.id]));

      const sideFileRows = plan.assets.flatMap((planned) =>
        Object.entries(lintedByPath.get(planned.report.path)!.sideFiles).map(([sidePath, contentHash]) => ({
          assetId: assetIdByPath.get(planned.report.path)!,
          path: sidePath,
          contentHash
        }))
      );
      const sideFileTable = assetSideFiles().getTableName();
      for (const rows of chunks(sideFileRows)) await queryInterface.bulkInsert(sideFileTable, rows, { transaction });

      const findingRows: Omit<InferCreationAttributes<FindingRecord>, 'id'>[] = plan.assets.flatMap((planned) =>
        planned.findings.map(({ finding, status, waiverId }) => ({
          ...findingColumnsOf(finding),
          buildId: build.id,
          assetId: assetIdByPath.get(planned.report.path)!,
          status,
          waived: waiverId !== null,
          waiverId
        }))
      );
      for (const rows of chunks(findingRows)) {
        await queryInterface.bulkInsert(FindingRecord.getTableName(), rows, { transaction });
      }

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

/** `rows` in slices of {@link ROWS_PER_INSERT}. */
function chunks<T>(rows: readonly T[]): T[][] {
  const slices: T[][] = [];
  for (let start = 0; start < rows.length; start += ROWS_PER_INSERT) {
    slices.push(rows.slice(start, start + ROWS_PER_INSERT));
  }
  return slices;
}

/**
 * One build with its checked assets, for the build detail route.
 */
import type { AssetStats } from '../../lint/lint-report';
import { Asset, Build } from '../db/models';
import { summarizeBuild, type BuildSummary } from './build-summary';

/** An asset of a build as the API shows it. */
export interface AssetView {
  id: number;
  path: string;
  /** SHA-256 of the main file. */
  contentHash: string;
  byteLength: number;
  unreadable: boolean;
  stats: AssetStats | null;
  /** Open findings (new or unchanged, not waived) by severity. */
  counts: { error: number; warning: number; info: number };
  /** Rule of the heaviest open finding; null when none is open. */
  worstRule: string | null;
}

/** A build with its assets and the baseline it was compared with. */
export interface BuildDetail {
  build: BuildSummary;
  baseline: { id: number; label: string | null; commit: string | null; createdAt: string } | null;
  assets: AssetView[];
}

/** The build's detail; assets in path order. */
export async function getBuildDetail(build: Build, projectSlug: string, origin: string): Promise<BuildDetail> {
  const [assets, baseline] = await Promise.all([
    Asset.findAll({ where: { buildId: build.id }, order: [['path', 'ASC']] }),
    build.baselineBuildId === null ? null : Build.findByPk(build.baselineBuildId)
  ]);
  return {
    build: summarizeBuild(build, projectSlug, origin),
    baseline: baseline && {
      id: baseline.id,
      label: baseline.label,
      commit: baseline.commitSha,
      createdAt: new Date(baseline.createdAt).toISOString()
    },
    assets: assets.map(toAssetView)
  };
}

/** The API view of a stored asset. */
export function toAssetView(asset: Asset): AssetView {
  return {
    id: asset.id,
    path: asset.path,
    contentHash: asset.contentHash,
    byteLength: asset.byteLength,
    unreadable: asset.unreadable,
    stats: asset.statsJson ? (JSON.parse(asset.statsJson) as AssetStats) : null,
    counts: { error: asset.errorCount, warning: asset.warningCount, info: asset.infoCount },
    worstRule: asset.worstRule
  };
}

/**
 * The asset view's outline: an asset of a build with its rotation channels (without their keys:
 * the plots read those from the channels API), the node hierarchy those channels animate, and the
 * asset's findings tied to their channels. Enough for the page's first paint.
 */
import { isAssetReadError } from '../../lint/asset-read-error';
import { SEVERITY_RANK, type Severity } from '../../lint/finding';
import { readRotationChannels } from '../../lint/read/read-rotation-channels';
import type { RotationChannel } from '../../lint/read/rotation-channel';
import { Asset, FindingRecord } from '../db/models';
import { ApiError } from '../ingest/api-error';
import { toAssetView, type AssetView } from '../builds/get-build-detail';
import { parseId } from '../builds/get-project-build';
import { toFindingView, type FindingView } from '../builds/list-findings';
import { readStoredAsset } from '../builds/read-stored-asset';

/** One rotation channel without its keys, with what the browser needs to preview its fix. */
export interface ChannelOutline {
  /** `animationIndex:channelIndex`, the channel's id in the page's URL. */
  id: string;
  animation: string;
  animationIndex: number;
  channelIndex: number;
  nodePath: string;
  nodeIndex: number;
  interpolation: RotationChannel['interpolation'];
  keyCount: number;
  /** Time of the last key minus the first, in seconds (0 for one key). */
  durationSeconds: number;
  raw: RotationChannel['raw'];
  quantizationStep: number;
  restRotation: RotationChannel['restRotation'];
  isRoot: boolean;
  /** Heaviest open finding (new or unchanged, waived included) on the channel; null when clean. */
  worstSeverity: Severity | null;
  /** Ids of the findings on the channel, worst first. */
  findingIds: number[];
}

/** A node on the way to animated nodes, in depth-first order. */
export interface NodeOutline {
  /** Node path from the scene root, e.g. `/Hero/Hips`. */
  path: string;
  /** Last segment of the path. */
  name: string;
  /** 0 for a scene root. */
  depth: number;
  /** Ids of the channels that rotate this node. */
  channelIds: string[];
  /** Heaviest open finding on this node's own channels; null when clean or not animated. */
  worstSeverity: Severity | null;
}

/** A finding of the asset, with the id of the channel it is about (null for node- or asset-level findings). */
export interface AssetFinding extends FindingView {
  channelId: string | null;
}

/** Why the asset has no channels to show. */
export interface AssetProblem {
  status: number;
  code: string;
  message: string;
}

/** The asset view's outline. `problem` is set when the stored file cannot be read; channels are then empty. */
export interface AssetOutline {
  asset: AssetView;
  channels: ChannelOutline[];
  nodes: NodeOutline[];
  findings: AssetFinding[];
  problem: AssetProblem | null;
}

/**
 * The outline of asset `assetIdText` of the build.
 * @throws ApiError 404 `asset.not-found` when the build has no such asset.
 */
export async function getAssetOutline(buildId: number, assetIdText: string): Promise<AssetOutline> {
  const assetId = parseId(assetIdText);
  const asset = assetId === null ? null : await Asset.findOne({ where: { id: assetId, buildId } });
  if (!asset) {
    throw new ApiError(404, 'asset.not-found', `This build has no asset "${assetIdText}". Check the asset id.`);
  }
  const rows = await FindingRecord.findAll({ where: { buildId, assetId: asset.id }, order: [['id', 'ASC']] });
  const views = rows.map(toFindingView).sort(worstFirst);
  let channels: RotationChannel[] = [];
  let problem: AssetProblem | null = null;
  try {
    channels = readRotationChannels(await readStoredAsset(asset));
  } catch (caught) {
    if (isAssetReadError(caught)) {
      problem = { status: 422, code: caught.code, message: `${asset.path} cannot be read: ${caught.message}` };
    } else if (caught instanceof ApiError) {
      problem = { status: caught.status, code: caught.code, message: caught.message };
    } else {
      throw caught;
    }
  }
  const findings = views.map((view) => ({ ...view, channelId: channelIdOf(view, channels) }));
  const outlines = channels.map((channel) => outlineOf(channel, findings));
  return { asset: toAssetView(asset), channels: outlines, nodes: nodeTreeOf(outlines), findings, problem };
}

/** The URL id of a channel. */
export function channelIdOf(
  view: Pick<FindingView, 'animation' | 'channel'>,
  channels: RotationChannel[]
): string | null {
  if (view.animation === null || view.channel === null) return null;
  const channel = channels.find((item) => item.animation === view.animation && item.channelIndex === view.channel);
  return channel ? `${channel.animationIndex}:${channel.channelIndex}` : null;
}

function outlineOf(channel: RotationChannel, findings: AssetFinding[]): ChannelOutline {
  const id = `${channel.animationIndex}:${channel.channelIndex}`;
  const own = findings.filter((finding) => finding.channelId === id);
  const keyCount = channel.keyCount;
  return {
    id,
    animation: channel.animation,
    animationIndex: channel.animationIndex,
    channelIndex: channel.channelIndex,
    nodePath: channel.nodePath,
    nodeIndex: channel.nodeIndex,
    interpolation: channel.interpolation,
    keyCount,
    durationSeconds: keyCount > 1 ? channel.times[keyCount - 1] - channel.times[0] : 0,
    raw: { ...channel.raw },
    quantizationStep: channel.quantizationStep,
    restRotation: [...channel.restRotation],
    isRoot: channel.isRoot,
    worstSeverity: worstOf(own),
    findingIds: own.map((finding) => finding.id)
  };
}

/** Every node on the path to an animated node, parents before children, siblings in the order their channels come. */
function nodeTreeOf(channels: ChannelOutline[]): NodeOutline[] {
  const byPath = new Map<string, NodeOutline>();
  const children = new Map<string, string[]>();
  const roots: string[] = [];
  for (const channel of channels) {
    const named = channel.nodePath.split('/').filter((segment) => segment !== '');
    const segments = named.length > 0 ? named : [`#${channel.nodeIndex}`];
    let parent: string | null = null;
    segments.forEach((segment, depth) => {
      const path = `${parent ?? ''}/${segment}`;
      if (!byPath.has(path)) {
        byPath.set(path, { path, name: segment, depth, channelIds: [], worstSeverity: null });
        if (parent === null) roots.push(path);
        else children.set(parent, [...(children.get(parent) ?? []), path]);
      }
      parent = path;
    });
    const node = byPath.get(`/${segments.join('/')}`);
    if (!node) continue;
    node.channelIds.push(channel.id);
    node.worstSeverity = heavier(node.worstSeverity, channel.worstSeverity);
  }
  const ordered: NodeOutline[] = [];
  const visit = (path: string) => {
    ordered.push(byPath.get(path)!);
    for (const child of children.get(path) ?? []) visit(child);
  };
  roots.forEach(visit);
  return ordered;
}

function worstOf(findings: AssetFinding[]): Severity | null {
  return findings
    .filter((finding) => finding.status !== 'fixed')
    .reduce<Severity | null>((worst, finding) => heavier(worst, finding.severity), null);
}

function heavier(a: Severity | null, b: Severity | null): Severity | null {
  if (a === null) return b;
  if (b === null) return a;
  return SEVERITY_RANK[b] > SEVERITY_RANK[a] ? b : a;
}

/** Open before fixed, then errors first, then by key. */
function worstFirst(a: FindingView, b: FindingView): number {
  const fixedA = a.status === 'fixed' ? 1 : 0;
  const fixedB = b.status === 'fixed' ? 1 : 0;
  if (fixedA !== fixedB) return fixedA - fixedB;
  const rank = SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity];
  if (rank !== 0) return rank;
  return (a.keys?.[0] ?? -1) - (b.keys?.[0] ?? -1) || a.id - b.id;
}

/**
 * One asset's rotation channels as time series for plots: per channel the key times, the four
 * quaternion components, each key's length, the angular speed of each segment, and markers for
 * the findings that point into the channel. One answer carries at most {@link MAX_PLOTTED_KEYS}
 * keys; a longer asset is asked for one channel at a time (`?channel=<animation>:<channel>`).
 *
 * Design notes: thinning a long channel to fit was rejected: markers, the key table and the fix
 * preview index the series by key, so a thinned series would put findings on the wrong keys and
 * preview fixes over keys that are not neighbours. A clear refusal that names the way out is
 * safer than a plot that looks right and is not.
 */
import { z } from 'zod';
import type { RotationChannel } from '../../lint/read/rotation-channel';
import { readRotationChannels } from '../../lint/read/read-rotation-channels';
import { isAssetReadError } from '../../lint/asset-read-error';
import type { Severity } from '../../lint/finding';
import { Asset, FindingRecord } from '../db/models';
import { ApiError } from '../ingest/api-error';
import { parseId } from './get-project-build';
import { readStoredAsset } from './read-stored-asset';

/** A finding shown on a channel plot. */
export interface ChannelMarker {
  findingId: number;
  /** First key the finding is about; null when it is about the whole channel. */
  keyIndex: number | null;
  keyLastIndex: number | null;
  rule: string;
  severity: Severity;
  status: 'new' | 'unchanged';
  waived: boolean;
  message: string;
}

/** One rotation channel as plot series. Arrays are per key except `angularSpeed`, which is per segment. */
export interface ChannelSeries {
  animation: string;
  animationIndex: number;
  channelIndex: number;
  nodePath: string;
  nodeIndex: number;
  interpolation: RotationChannel['interpolation'];
  keyCount: number;
  times: number[];
  x: number[];
  y: number[];
  z: number[];
  w: number[];
  /** |q| per key. */
  length: number[];
  /** Degrees per second from key k to k+1 along the shorter arc; null where time does not advance. */
  angularSpeed: (number | null)[];
  markers: ChannelMarker[];
}

/**
 * Most keys one answer carries, over all its channels: about 140 bytes of JSON per key (seven
 * numbers), so some 28 MB, as much as a browser tab plots without stalling (common practice).
 */
export const MAX_PLOTTED_KEYS = 200_000;

/** Query of the channels route: `channel=<animationIndex>:<channelIndex>` picks one channel. */
export const assetChannelsQuerySchema = z
  .object({
    channel: z
      .string()
      .regex(/^\d{1,6}:\d{1,6}$/, 'must be <animationIndex>:<channelIndex>, e.g. 0:3')
      .transform((text) => {
        const [animationIndex, channelIndex] = text.split(':').map(Number);
        return { animationIndex, channelIndex };
      })
      .optional()
  })
  .strict();

/** The parsed query of the channels route. */
export type AssetChannelsQuery = z.output<typeof assetChannelsQuerySchema>;

/** The channels of an asset. */
export interface AssetChannels {
  asset: { id: number; path: string };
  channels: ChannelSeries[];
}

/**
 * The rotation channels of asset `assetIdText` of the build, or the one channel `query.channel` names.
 * @throws ApiError 404 `asset.not-found` or `channel.not-found`, 422 `asset.unreadable` when the
 *   stored file cannot be read, 422 `channels.too-many-keys` past {@link MAX_PLOTTED_KEYS}.
 */
export async function getAssetChannels(
  buildId: number,
  assetIdText: string,
  query: AssetChannelsQuery = {}
): Promise<AssetChannels> {
  const assetId = parseId(assetIdText);
  const asset = assetId === null ? null : await Asset.findOne({ where: { id: assetId, buildId } });
  if (!asset) {
    throw new ApiError(404, 'asset.not-found', `This build has no asset "${assetIdText}". Check the asset id.`);
  }
  let channels: RotationChannel[];
  try {
    channels = readRotationChannels(await readStoredAsset(asset));
  } catch (error) {
    if (!isAssetReadError(error)) throw error;
    throw new ApiError(
      422,
      'asset.unreadable',
      `${asset.path} cannot be read, so it has no channels to plot: ${error.message}`,
      {
        cause: error
      }
    );
  }
  channels = pickChannels(asset.path, channels, query);
  const findings = await FindingRecord.findAll({
    where: { buildId, assetId: asset.id, status: ['new', 'unchanged'] },
    order: [['id', 'ASC']]
  });
  return {
    asset: { id: asset.id, path: asset.path },
    channels: channels.map((channel) => toSeries(channel, findings))
  };
}

/** The channels the query asks for, refused when they hold more keys than one answer carries. */
function pickChannels(assetPath: string, channels: RotationChannel[], query: AssetChannelsQuery): RotationChannel[] {
  const wanted = query.channel;
  const picked = wanted
    ? channels.filter(
        (channel) => channel.animationIndex === wanted.animationIndex && channel.channelIndex === wanted.channelIndex
      )
    : channels;
  if (wanted && picked.length === 0) {
    throw new ApiError(
      404,
      'channel.not-found',
      `${assetPath} has no rotation channel ${wanted.animationIndex}:${wanted.channelIndex}. ` +
        'Leave out ?channel= to list every channel with its animation and channel index.'
    );
  }
  const keyCount = picked.reduce((sum, channel) => sum + channel.keyCount, 0);
  if (keyCount <= MAX_PLOTTED_KEYS) return picked;
  const limit = MAX_PLOTTED_KEYS.toLocaleString('en-US');
  const what = wanted
    ? `Channel ${wanted.animationIndex}:${wanted.channelIndex} of ${assetPath} has ${keyCount.toLocaleString('en-US')} keys`
    : `${assetPath} has ${keyCount.toLocaleString('en-US')} rotation keys in ${picked.length} channels`;
  const next = wanted
    ? 'Its findings are still listed with the build; run `orientry check` on the file to see every key.'
    : 'Ask for one channel at a time with ?channel=<animationIndex>:<channelIndex>.';
  throw new ApiError(422, 'channels.too-many-keys', `${what}, more than the ${limit} one plot answer carries. ${next}`);
}

/** Plot series of one channel. */
export function toSeries(channel: RotationChannel, findings: readonly FindingRecord[]): ChannelSeries {
  const keyCount = channel.keyCount;
  const series: ChannelSeries = {
    animation: channel.animation,
    animationIndex: channel.animationIndex,
    channelIndex: channel.channelIndex,
    nodePath: channel.nodePath,
    nodeIndex: channel.nodeIndex,
    interpolation: channel.interpolation,
    keyCount,
    times: Array.from(channel.times.subarray(0, keyCount)),
    x: [],
    y: [],
    z: [],
    w: [],
    length: [],
    angularSpeed: [],
    markers: findings
      .filter((row) => row.animation === channel.animation && row.channel === channel.channelIndex)
      .map((row) => ({
        findingId: row.id,
        keyIndex: row.keyFirst,
        keyLastIndex: row.keyLast,
        rule: row.rule,
        severity: row.severity,
        status: row.status as 'new' | 'unchanged',
        waived: row.waived,
        message: row.message
      }))
  };
  const v = channel.values;
  for (let key = 0; key < keyCount; key++) {
    const [x, y, z, w] = [v[key * 4], v[key * 4 + 1], v[key * 4 + 2], v[key * 4 + 3]];
    series.x.push(x);
    series.y.push(y);
    series.z.push(z);
    series.w.push(w);
    series.length.push(Math.hypot(x, y, z, w));
  }
  for (let key = 0; key + 1 < keyCount; key++) {
    const seconds = channel.times[key + 1] - channel.times[key];
    const degrees = arcDegrees(v, key * 4, (key + 1) * 4);
    series.angularSpeed.push(seconds > 0 && degrees !== null ? degrees / seconds : null);
  }
  return series;
}

/**
 * Rotation angle in degrees between the quaternions at offsets `a` and `b`, along the shorter
 * arc: 2·acos(|a·b| / (|a||b|)). glTF 2.0 Appendix C interpolates rotations with slerp over the
 * shorter path, so this is the turn a player shows. Null when either key has zero length.
 */
function arcDegrees(values: Float32Array, a: number, b: number): number | null {
  let dot = 0;
  let lengthA = 0;
  let lengthB = 0;
  for (let i = 0; i < 4; i++) {
    dot += values[a + i] * values[b + i];
    lengthA += values[a + i] * values[a + i];
    lengthB += values[b + i] * values[b + i];
  }
  const lengths = Math.sqrt(lengthA * lengthB);
  if (!(lengths > 0)) return null;
  const cosine = Math.min(1, Math.abs(dot) / lengths);
  return (2 * Math.acos(cosine) * 180) / Math.PI;
}

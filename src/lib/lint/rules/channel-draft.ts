/**
 * Builds the finding draft for a run of keys in one rotation channel, and the plain-words
 * location every channel message starts from. Keeping both here means every rule names places
 * the same way: `animation "Walk", channel 3 (/Hero/Hips), keys 12–15 (0.4–0.5 s)`.
 */
import type { Severity, FindingValues } from '../finding';
import type { RotationChannel } from '../read/rotation-channel';
import type { FindingDraft } from './rule';
import { formatSeconds } from './format-number';

/** A key's time in seconds, rounded to microseconds, or null when the stored time is not finite. */
export function keyTimeSeconds(channel: RotationChannel, keyIndex: number): number | null {
  const time = channel.times[keyIndex];
  return Number.isFinite(time) ? Math.round(time * 1e6) / 1e6 : null;
}

/** `animation "Walk", channel 3 (/Hero/Hips)`: which channel, for messages. */
export function describeChannel(channel: RotationChannel): string {
  return `animation "${channel.animation}", channel ${channel.channelIndex} (${channel.nodePath})`;
}

/** `key 12 (0.4 s)` or `keys 12–15 (0.4–0.5 s)`: which keys, for messages. */
export function describeKeys(channel: RotationChannel, first: number, last: number): string {
  const from = keyTimeSeconds(channel, first);
  const to = keyTimeSeconds(channel, last);
  if (first === last) return from === null ? `key ${first}` : `key ${first} (${formatSeconds(from)})`;
  const span = from === null || to === null ? '' : ` (${formatSeconds(from).replace(' s', '')}–${formatSeconds(to)})`;
  return `keys ${first}–${last}${span}`;
}

/** `animation "Walk", channel 3 (/Hero/Hips), keys 12–15 (0.4–0.5 s)`. */
export function describePlace(channel: RotationChannel, first: number, last: number): string {
  return `${describeChannel(channel)}, ${describeKeys(channel, first, last)}`;
}

/** What a channel rule passes in; the draft fills animation, channel, node, keys, time and target. */
export interface ChannelDraftInput {
  first: number;
  last: number;
  values: FindingValues;
  message: string;
  hint: string;
  severity?: Severity;
  /** Fingerprint discriminator; `rotation` (the channel's target path) unless set. */
  target?: string;
}

/** A finding draft about keys `first`..`last` of `channel`. */
export function channelDraft(channel: RotationChannel, input: ChannelDraftInput): FindingDraft {
  const time = keyTimeSeconds(channel, input.first);
  const draft: FindingDraft = {
    animation: channel.animation,
    channel: channel.channelIndex,
    node: channel.nodePath,
    keys: [input.first, input.last],
    time,
    values: input.values,
    message: input.message,
    hint: input.hint,
    // Without a time the fingerprint cannot tell two runs apart, so the key index stands in.
    target: input.target ?? (time === null ? `rotation@key${input.first}` : 'rotation')
  };
  if (input.severity !== undefined) draft.severity = input.severity;
  return draft;
}

/** A finding draft about the whole channel rather than some of its keys (encoding, key counts). */
export function wholeChannelDraft(
  channel: RotationChannel,
  input: Omit<ChannelDraftInput, 'first' | 'last'>
): FindingDraft {
  return {
    animation: channel.animation,
    channel: channel.channelIndex,
    node: channel.nodePath,
    keys: null,
    time: null,
    values: input.values,
    message: input.message,
    hint: input.hint,
    target: input.target ?? 'rotation',
    ...(input.severity === undefined ? {} : { severity: input.severity })
  };
}

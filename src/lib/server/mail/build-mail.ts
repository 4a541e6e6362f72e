/**
 * What a build e-mail says, as plain data, and its subject line. Two kinds: `regression` (the build
 * failed the gate or brought new findings at the project's notify severity) and `fixed` (a build on
 * the base branch made findings go away). The HTML and text bodies (build-mail-html.ts,
 * build-mail-text.ts) render the same data, so both always tell the same story.
 */
import type { Severity } from '../../lint/finding';

/** A finding as the e-mail lists it. */
export interface BuildMailFinding {
  rule: string;
  severity: Severity;
  node: string | null;
  animation: string | null;
  timeSeconds: number | null;
  message: string;
}

/** The findings of one asset, with the link to its asset view. */
export interface BuildMailAsset {
  path: string;
  /** Absolute URL of `/projects/{slug}/builds/{id}/assets/{assetId}`. */
  url: string;
  findings: BuildMailFinding[];
}

/** Everything an e-mail about one build says to one person. */
export interface BuildMail {
  kind: 'regression' | 'fixed';
  projectName: string;
  branch: string;
  /** The build's label, or `#<id>` when CI gave none. */
  buildName: string;
  commitSha: string | null;
  verdict: 'pass' | 'fail';
  verdictReason: string | null;
  /** Lowest severity the project mails about. */
  notifySeverity: Severity;
  /** New findings at or above the notify severity, grouped by asset (perhaps cut short, see the counts). */
  newFindings: BuildMailAsset[];
  newCount: number;
  /** Findings of the baseline gone in this build, grouped by asset (perhaps cut short). */
  fixedFindings: BuildMailAsset[];
  fixedCount: number;
  reportUrl: string;
  /** Why this person gets it: they lead the project, or they subscribed to it. */
  reason: 'lead' | 'subscribed';
  unsubscribeUrl: string;
  profileUrl: string;
}

/**
 * The subject: project, branch, build and the count that matters.
 *
 * @example subjectOf(mail) → '[Tidewatch Characters] feature · build b-0312 failed: 2 new findings'
 */
export function subjectOf(mail: BuildMail): string {
  const head = `[${oneLine(mail.projectName)}] ${oneLine(mail.branch)} · build ${oneLine(mail.buildName)}`;
  if (mail.kind === 'fixed') return `${head}: ${plural(mail.fixedCount, 'finding')} fixed`;
  const outcome = mail.verdict === 'fail' ? ' failed' : '';
  return `${head}${outcome}: ${plural(mail.newCount, 'new finding')}`;
}

/** `1 new finding`, `3 new findings`. */
export function plural(count: number, noun: string): string {
  return `${count} ${noun}${count === 1 ? '' : 's'}`;
}

/** Where a finding sits, e.g. `/Diver/Hips · Swim · 1.25 s`; parts that are unknown are left out. */
export function placeOf(finding: BuildMailFinding): string {
  const parts = [finding.node ?? '(asset)'];
  if (finding.animation) parts.push(finding.animation);
  if (finding.timeSeconds !== null) parts.push(`${formatSeconds(finding.timeSeconds)} s`);
  return parts.join(' · ');
}

/** Severities at or above `severity`, as the e-mail words the threshold: `errors`, `warnings and errors`… */
export function thresholdWords(severity: Severity): string {
  if (severity === 'error') return 'errors';
  if (severity === 'warning') return 'warnings and errors';
  return 'all severities';
}

function formatSeconds(seconds: number): string {
  return Number.isInteger(seconds) ? seconds.toFixed(1) : String(Number(seconds.toFixed(3)));
}

/** Subjects are one line: control characters and runs of spaces become one space. */
function oneLine(text: string): string {
  const printable = [...text].map((character) => {
    const code = character.charCodeAt(0);
    return code < 0x20 || code === 0x7f ? ' ' : character;
  });
  return printable.join('').replace(/\s+/g, ' ').trim();
}

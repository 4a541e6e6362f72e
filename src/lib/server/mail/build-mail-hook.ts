/**
 * The build-stored hook that queues build e-mails, inside the build's own transaction: the
 * messages exist exactly when the build does, so a rolled-back upload mails nobody and a
 * re-submitted build (same idempotency key, so no new build) mails nobody again.
 *
 * One e-mail per build and recipient, dedupe key `build:<id>:<kind>:<userId>`:
 * - `regression` when the build failed the gate, or brought new (not waived) findings at or above
 *   the project's notify severity;
 * - otherwise `fixed` when the project announces fixes, the build is on the base branch, and
 *   baseline findings at or above the notify severity went away.
 */
import { isAtLeast, SEVERITY_RANK } from '../../lint/finding';
import { reportPathOf } from '../builds/build-summary';
import { Asset } from '../db/models';
import type { BuildStoredHook, StoredBuildContext } from '../ingest/build-stored-hooks';
import type { PlannedFinding } from '../ingest/plan-build';
import { subjectOf, type BuildMail, type BuildMailAsset } from './build-mail';
import { renderBuildMailHtml } from './build-mail-html';
import { listBuildMailRecipients } from './build-mail-recipients';
import { renderBuildMailText } from './build-mail-text';
import * as outbox from './outbox';
import { getProjectNotify } from './project-notify';
import * as unsubscribeLink from './unsubscribe-link';

/** Most findings one e-mail lists in each section; the report has the rest. */
export const MAX_LISTED_FINDINGS = { new: 30, fixed: 15 };

/** Queues the build's e-mails, if any (register with `onBuildStored`). */
export const queueBuildMail: BuildStoredHook = async (context) => {
  const { project, build, plan, transaction } = context;
  const notify = await getProjectNotify(project.id, transaction);
  const isBaseBranch = build.branch === project.baseBranch;
  const all = plan.assets.flatMap((asset) => asset.findings.map((planned) => ({ path: asset.report.path, planned })));
  const isNotable = (planned: PlannedFinding) => isAtLeast(planned.finding.severity, notify.severity);
  const newFindings = all.filter(
    ({ planned }) => planned.status === 'new' && planned.waiverId === null && isNotable(planned)
  );
  const fixedFindings = all.filter(({ planned }) => planned.status === 'fixed' && isNotable(planned));

  let kind: BuildMail['kind'];
  if (build.verdict === 'fail' || newFindings.length > 0) kind = 'regression';
  else if (notify.onFixed && isBaseBranch && fixedFindings.length > 0) kind = 'fixed';
  else return;

  const recipients = await listBuildMailRecipients(project.id, isBaseBranch, transaction);
  if (recipients.length === 0) return;

  const origin = originOf(context);
  const assets = await Asset.findAll({ where: { buildId: build.id }, attributes: ['id', 'path'], transaction });
  const assetUrls = new Map(
    assets.map((asset) => [asset.path, `${origin}${reportPathOf(project.slug, build.id)}/assets/${asset.id}`])
  );
  const now = new Date();
  for (const recipient of recipients) {
    const mail: BuildMail = {
      kind,
      projectName: project.name,
      branch: build.branch,
      buildName: build.label ?? `#${build.id}`,
      commitSha: build.commitSha,
      verdict: build.verdict,
      verdictReason: build.verdictReason,
      notifySeverity: notify.severity,
      newFindings: groupByAsset(newFindings, MAX_LISTED_FINDINGS.new, assetUrls, context.reportUrl),
      newCount: newFindings.length,
      fixedFindings: groupByAsset(fixedFindings, MAX_LISTED_FINDINGS.fixed, assetUrls, context.reportUrl),
      fixedCount: fixedFindings.length,
      reportUrl: context.reportUrl,
      reason: recipient.reason,
      unsubscribeUrl: unsubscribeLink.urlFor(origin, recipient.userId, now),
      profileUrl: `${origin}/profile`
    };
    const subject = subjectOf(mail);
    await outbox.enqueue(
      {
        kind: `build-${kind}`,
        toAddress: recipient.email,
        subject,
        textBody: renderBuildMailText(mail),
        htmlBody: renderBuildMailHtml(mail, subject),
        headers: {
          'List-Unsubscribe': `<${mail.unsubscribeUrl}>`,
          'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
        },
        buildId: build.id,
        dedupeKey: `build:${build.id}:${kind}:${recipient.userId}`
      },
      { transaction }
    );
  }
};

/** The heaviest findings first (up to `limit`), grouped by asset in the order the assets first appear. */
function groupByAsset(
  findings: readonly { path: string; planned: PlannedFinding }[],
  limit: number,
  assetUrls: ReadonlyMap<string, string>,
  reportUrl: string
): BuildMailAsset[] {
  const listed = [...findings]
    .sort((a, b) => SEVERITY_RANK[b.planned.finding.severity] - SEVERITY_RANK[a.planned.finding.severity])
    .slice(0, limit);
  const byPath = new Map<string, BuildMailAsset>();
  for (const { path, planned } of listed) {
    let asset = byPath.get(path);
    if (!asset) {
      asset = { path, url: assetUrls.get(path) ?? reportUrl, findings: [] };
      byPath.set(path, asset);
    }
    const { finding } = planned;
    asset.findings.push({
      rule: finding.rule,
      severity: finding.severity,
      node: finding.node,
      animation: finding.animation,
      timeSeconds: finding.time,
      message: finding.message
    });
  }
  return [...byPath.values()];
}

/** The public origin the upload came in on, from the report URL ingestion built with it. */
function originOf({ reportUrl, project, build }: StoredBuildContext): string {
  const path = reportPathOf(project.slug, build.id);
  return reportUrl.endsWith(path) ? reportUrl.slice(0, -path.length) : new URL(reportUrl).origin;
}

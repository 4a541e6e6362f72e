/**
 * The HTML body of a build e-mail: a verdict banner, links to the report, then the new and the
 * fixed findings grouped by asset, each asset linking to its view. Every string from a build
 * (names of nodes, animations, assets, branches; messages) is escaped: uploads choose them.
 */
import type { Severity } from '../../lint/finding';
import { placeOf, plural, thresholdWords, type BuildMail, type BuildMailAsset } from './build-mail';
import { escapeHtml } from './escape-html';
import { MAIL_COLORS as c, MAIL_MONO_FONT, mailButton, mailLink, renderMailHtml } from './mail-layout';

/** The HTML body of `mail`, with `subject` as its title. */
export function renderBuildMailHtml(mail: BuildMail, subject: string): string {
  const parts: string[] = [banner(mail)];
  parts.push(`<p style="margin:0 0 16px 0;">${mailButton(mail.reportUrl, 'Open the build report')}</p>`, facts(mail));
  if (mail.kind === 'regression') {
    parts.push(heading(`New findings · ${thresholdWords(mail.notifySeverity)}`, mail.newCount));
    if (mail.newCount === 0) {
      parts.push(paragraph('None at this severity; the gate reason above says what failed.'));
    }
    parts.push(assetList(mail.newFindings, mail.newCount, mail.reportUrl));
  }
  if (mail.fixedCount > 0) {
    parts.push(heading('Fixed since the baseline', mail.fixedCount));
    parts.push(assetList(mail.fixedFindings, mail.fixedCount, mail.reportUrl));
  }
  const why =
    mail.reason === 'lead'
      ? `You get this because you lead ${escapeHtml(mail.projectName)}.`
      : `You get this because you subscribed to ${escapeHtml(mail.projectName)}.`;
  const footer = `${why} ${mailLink(mail.unsubscribeUrl, 'Unsubscribe')} · ${mailLink(mail.profileUrl, 'Mail settings')}`;
  const preview =
    mail.kind === 'fixed'
      ? `${plural(mail.fixedCount, 'finding')} fixed on ${mail.branch}`
      : `${plural(mail.newCount, 'new finding')} on ${mail.branch}${mail.verdictReason ? ` · ${mail.verdictReason}` : ''}`;
  return renderMailHtml({ title: subject, preview, bodyHtml: parts.join('\n'), footerHtml: footer });
}

function banner(mail: BuildMail): string {
  const isGood = mail.kind === 'fixed' || mail.verdict === 'pass';
  const [text, background, border] = isGood
    ? [c.passText, c.passBg, c.passBorder]
    : [c.failText, c.failBg, c.failBorder];
  const headline =
    mail.kind === 'fixed'
      ? `${plural(mail.fixedCount, 'finding')} fixed`
      : mail.verdict === 'fail'
        ? 'Build failed the gate'
        : `${plural(mail.newCount, 'new finding')}`;
  const reason =
    mail.kind === 'regression' && mail.verdictReason
      ? `<div style="margin-top:4px;font-size:13px;line-height:18px;">${escapeHtml(mail.verdictReason)}</div>`
      : '';
  return (
    `<div style="background:${background};border:1px solid ${border};color:${text};border-radius:6px;padding:10px 12px;margin:0 0 16px 0;">` +
    `<div style="font-size:15px;font-weight:600;">${escapeHtml(headline)}</div>` +
    `<div style="margin-top:2px;font-size:13px;">${escapeHtml(mail.projectName)} · build ${escapeHtml(mail.buildName)} on ` +
    `<span style="font-family:${MAIL_MONO_FONT};">${escapeHtml(mail.branch)}</span></div>${reason}</div>`
  );
}

function facts(mail: BuildMail): string {
  const rows: [string, string][] = [
    ['Project', escapeHtml(mail.projectName)],
    ['Branch', `<span style="font-family:${MAIL_MONO_FONT};">${escapeHtml(mail.branch)}</span>`],
    ['Build', escapeHtml(mail.buildName)]
  ];
  if (mail.commitSha) {
    rows.push([
      'Commit',
      `<span style="font-family:${MAIL_MONO_FONT};">${escapeHtml(mail.commitSha.slice(0, 12))}</span>`
    ]);
  }
  const body = rows
    .map(
      ([label, value]) =>
        `<tr><td style="padding:2px 16px 2px 0;color:${c.ink500};font-size:13px;white-space:nowrap;">${label}</td>` +
        `<td style="padding:2px 0;font-size:13px;">${value}</td></tr>`
    )
    .join('');
  return `<table role="presentation" cellpadding="0" cellspacing="0" style="margin:0 0 8px 0;">${body}</table>`;
}

function heading(title: string, count: number): string {
  return (
    `<h2 style="margin:20px 0 8px 0;font-size:14px;line-height:20px;font-weight:600;color:${c.ink900};">` +
    `${escapeHtml(title)} <span style="color:${c.ink500};font-weight:400;">(${count})</span></h2>`
  );
}

function paragraph(text: string): string {
  return `<p style="margin:0 0 12px 0;color:${c.ink600};">${escapeHtml(text)}</p>`;
}

function assetList(assets: readonly BuildMailAsset[], total: number, reportUrl: string): string {
  let shown = 0;
  const blocks = assets.map((asset) => {
    const rows = asset.findings.map((finding, index) => {
      shown++;
      const rule = index < asset.findings.length - 1 ? `border-bottom:1px solid ${c.ink100};` : '';
      return (
        `<tr><td style="padding:6px 8px 6px 0;vertical-align:top;white-space:nowrap;">${severityChip(finding.severity)}</td>` +
        `<td style="padding:6px 0;vertical-align:top;${rule}">` +
        `<div style="font-family:${MAIL_MONO_FONT};font-size:12px;color:${c.ink900};">${escapeHtml(finding.rule)}</div>` +
        `<div style="font-size:12px;color:${c.ink600};">${escapeHtml(placeOf(finding))}</div>` +
        `<div style="font-size:13px;line-height:18px;margin-top:2px;">${escapeHtml(finding.message)}</div></td></tr>`
      );
    });
    return (
      `<div style="margin:0 0 12px 0;border:1px solid ${c.ink100};border-radius:6px;">` +
      `<div style="background:${c.ink50};padding:6px 10px;border-bottom:1px solid ${c.ink100};font-family:${MAIL_MONO_FONT};font-size:12px;">` +
      `${mailLink(asset.url, asset.path)}</div>` +
      `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="padding:0 10px;">${rows.join('')}</table></div>`
    );
  });
  if (total > shown) {
    blocks.push(
      `<p style="margin:0 0 12px 0;color:${c.ink600};">… and ${total - shown} more in the ${mailLink(reportUrl, 'build report')}.</p>`
    );
  }
  return blocks.join('\n');
}

function severityChip(severity: Severity): string {
  const [text, background] =
    severity === 'error'
      ? [c.errorText, c.errorBg]
      : severity === 'warning'
        ? [c.warningText, c.warningBg]
        : [c.infoText, c.infoBg];
  return `<span style="display:inline-block;min-width:52px;text-align:center;font-size:11px;font-weight:600;line-height:16px;padding:1px 6px;border-radius:4px;background:${background};color:${text};">${severity}</span>`;
}

/**
 * The plain-text body of a build e-mail: the same facts as the HTML body, readable in any mail
 * client and in logs. Lines stay short; URLs stand on their own lines so clients make them links.
 */
import { placeOf, plural, thresholdWords, type BuildMail, type BuildMailAsset } from './build-mail';

/** The text body of `mail`. */
export function renderBuildMailText(mail: BuildMail): string {
  const lines: string[] = [];
  const where = `${mail.projectName}, build ${mail.buildName} on ${mail.branch}`;
  if (mail.kind === 'fixed') {
    lines.push(`${where}: ${plural(mail.fixedCount, 'finding')} fixed.`);
  } else {
    lines.push(`${where} ${mail.verdict === 'fail' ? 'failed the gate' : 'passed the gate'}.`);
    if (mail.verdictReason) lines.push(`Gate: ${mail.verdictReason}`);
  }
  if (mail.commitSha) lines.push(`Commit: ${mail.commitSha}`);
  lines.push('', `Build report: ${mail.reportUrl}`);

  if (mail.kind === 'regression') {
    lines.push('', `New findings (${thresholdWords(mail.notifySeverity)}): ${mail.newCount}`);
    if (mail.newCount === 0) lines.push('  None at this severity; the gate reason above says what failed.');
    lines.push(...assetLines(mail.newFindings, mail.newCount));
  }
  if (mail.fixedCount > 0) {
    lines.push('', `Fixed since the baseline: ${mail.fixedCount}`);
    lines.push(...assetLines(mail.fixedFindings, mail.fixedCount));
  }

  lines.push(
    '',
    '-- ',
    mail.reason === 'lead'
      ? `You get this because you lead ${mail.projectName}.`
      : `You get this because you subscribed to ${mail.projectName}.`,
    `Stop these e-mails: ${mail.unsubscribeUrl}`,
    `Mail settings: ${mail.profileUrl}`
  );
  return lines.join('\n') + '\n';
}

function assetLines(assets: readonly BuildMailAsset[], total: number): string[] {
  const lines: string[] = [];
  let shown = 0;
  for (const asset of assets) {
    lines.push('', asset.path, `  ${asset.url}`);
    for (const finding of asset.findings) {
      shown++;
      lines.push(`  - ${finding.severity} ${finding.rule} at ${placeOf(finding)}`, `    ${finding.message}`);
    }
  }
  if (total > shown) lines.push('', `… and ${total - shown} more in the build report.`);
  return lines;
}

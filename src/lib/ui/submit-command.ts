/**
 * The shell command a CI job runs to send a build to this server, shown in empty states so the first build is one
 * copy-paste away. One option per line so it reads in a narrow box; the token stays in the `ORIENTRY_TOKEN`
 * environment variable so nobody pastes a secret into a CI file.
 *
 * @example submitCommand('https://orientry.lanternfish.example', 'tidewatch-characters')
 *   → 'orientry submit \\\n  --server https://orientry.lanternfish.example \\\n  --project tidewatch-characters \\ …'
 */
export function submitCommand(serverUrl: string, projectSlug: string): string {
  return [
    'orientry submit \\',
    `  --server ${serverUrl} \\`,
    `  --project ${projectSlug} \\`,
    '  --branch "$CI_BRANCH" --commit "$CI_COMMIT" \\',
    '  "export/**/*.glb"'
  ].join('\n');
}

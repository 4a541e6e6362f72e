/**
 * The shell command a CI job runs to send a build to this server, shown in empty states so the first build is one
 * copy-paste away. One option per line so it reads in a narrow box. Branch, commit and label are left out: the CLI
 * takes them from the CI variables or git. The token comes from the `ORIENTRY_TOKEN` environment variable, so
 * nobody pastes a secret into a CI file.
 *
 * @example submitCommand('https://orientry.lanternfish.example', 'tidewatch-characters')
 *   → 'orientry submit "export/**\/*.glb" \\\n  --server https://orientry.lanternfish.example \\\n  --project tidewatch-characters'
 */
export function submitCommand(serverUrl: string, projectSlug: string): string {
  return ['orientry submit "export/**/*.glb" \\', `  --server ${serverUrl} \\`, `  --project ${projectSlug}`].join(
    '\n'
  );
}

/**
 * `npm run demo`: builds the app if needed, creates a fresh demo database (DATABASE_URL,
 * default sqlite:data/demo.db, deleted and recreated each run), seeds the Lanternfish
 * Interactive scenario, starts the production server on http://localhost:3000 (PORT overrides)
 * and prints where to sign in with which demo account. Ctrl-C stops it. ORIGIN defaults to
 * http://localhost:<PORT>, so open that address (not 127.0.0.1) or set ORIGIN to the one you use.
 */
import { ensureBuild } from './ensure-build.js';
import { importTs, reportScriptError } from './run-ts.js';
import { followServer, startServer } from './serve-build.js';

try {
  process.env.DATABASE_URL ??= 'sqlite:data/demo.db';
  const port = process.env.PORT ?? '3000';
  const url = `http://localhost:${port}`;
  // adapter-node assumes https unless ORIGIN says otherwise; form posts then fail its origin check.
  process.env.ORIGIN ??= url;

  ensureBuild();
  const demo = await importTs('src/lib/server/demo/prepare-demo.ts');
  const seed = await demo.prepareDemo();
  console.log(`Orientry demo: fresh database ${seed.databaseFile}`);

  const child = await startServer({ env: { ...process.env, PORT: port }, url });
  followServer(child);
  await demo.seedHistory(url, seed.tokens);

  const lines = [
    '',
    `Orientry demo is running at ${url}  (Ctrl-C stops it)`,
    `Sign in at ${url}/signin as one of the Lanternfish Interactive team:`,
    ''
  ];
  for (const account of seed.accounts) {
    lines.push(
      `  ${account.role.padEnd(7)} ${account.email.padEnd(29)} password: ${account.password.padEnd(17)} ${account.name}, ${account.title}`
    );
  }
  lines.push('', 'Projects and their CI tokens (for the orientry CLI, --server ' + url + '):', '');
  for (const project of demo.DEMO_PROJECTS) {
    const token = seed.tokens.find((entry) => entry.projectSlug === project.slug);
    lines.push(`  ${project.slug.padEnd(21)} ${token?.secret ?? '(no token)'}`);
    lines.push(`  ${''.padEnd(21)} ${project.summary}`);
  }
  lines.push('', 'These passwords and tokens are public demo values: never use them for real data.', '');
  console.log(lines.join('\n'));
} catch (error) {
  reportScriptError(error);
  process.exit(process.exitCode ?? 1);
}

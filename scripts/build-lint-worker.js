/**
 * Bundles the server's lint thread (src/lib/server/ingest/lint-worker.ts) into
 * build/lint-worker.mjs, next to the app adapter-node wrote (`npm run build` runs this after
 * `vite build`, which empties build/ first). The thread is started from a file of its own, which
 * the SvelteKit build has no place for. npm packages stay imports, resolved from node_modules as
 * the app's own are.
 */
import { build } from 'esbuild';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const outfile = resolve(root, process.argv[2] ?? 'build/lint-worker.mjs');

await build({
  entryPoints: [resolve(root, 'src/lib/server/ingest/lint-worker.ts')],
  outfile,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  alias: { $lib: resolve(root, 'src/lib') },
  logLevel: 'warning'
});

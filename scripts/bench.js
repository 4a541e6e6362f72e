/**
 * Runs the benchmarks: all of them (`npm run bench`), or those whose file name contains an
 * argument (`node scripts/bench.js ingest`, `npm run bench -- engine`). Each bench/*.bench.ts is
 * bundled with esbuild (`$lib` → src/lib, packages external) into bench-output/, then run in its
 * own `node --expose-gc` process so one bench's heap never skews another's figures. A new bench
 * is a new bench/<name>.bench.ts: nothing to register.
 *
 * - lint-engine: reading and linting one large animated GLB in this process.
 * - ingest: `orientry submit` of 50 GLBs (about 100 MB) to a local server against `orientry
 *   check` of the same files; builds the CLI and the app first when needed.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const benchDir = path.join(root, 'bench');
const outDir = path.join(root, 'bench-output');
const filters = process.argv.slice(2);

const benches = fs
  .readdirSync(benchDir)
  .filter((file) => file.endsWith('.bench.ts'))
  .filter((file) => filters.length === 0 || filters.some((filter) => file.includes(filter)))
  .sort();

if (benches.length === 0) {
  const known = fs.readdirSync(benchDir).filter((file) => file.endsWith('.bench.ts'));
  process.stderr.write(`No bench matches ${filters.join(', ')}. Known: ${known.join(', ')}\n`);
  process.exitCode = 2;
} else {
  fs.mkdirSync(outDir, { recursive: true });
  for (const file of benches) {
    const outfile = path.join(outDir, file.replace(/\.ts$/, '.mjs'));
    await build({
      entryPoints: [path.join(benchDir, file)],
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      packages: 'external',
      alias: { $lib: path.join(root, 'src', 'lib') },
      outfile,
      sourcemap: 'inline',
      logLevel: 'warning'
    });
    process.stderr.write(`\n▶ ${file}\n`);
    const result = spawnSync(process.execPath, ['--expose-gc', outfile], { stdio: 'inherit', cwd: root });
    if (result.status !== 0) {
      process.stderr.write(`${file} failed (exit ${result.status ?? result.signal}).\n`);
      process.exitCode = 1;
    }
  }
}

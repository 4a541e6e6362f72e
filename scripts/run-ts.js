/**
 * Runs server TypeScript from plain Node scripts: bundles one .ts entry with esbuild (`$lib` →
 * `src/lib`, packages left external so node_modules provides them) into node_modules/.cache/orientry/,
 * then imports it. The bundled code must not import `$app/*` or `$env/*`.
 *
 *   import { importTs } from './run-ts.js';
 *   const { prepareDemo } = await importTs('src/lib/server/demo/prepare-demo.ts');
 *
 * From a shell, `node scripts/run-ts.js <entry.ts> <exportedFunction>` calls that export with no arguments.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';

/** Repository root (the folder above scripts/). */
export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

const CACHE_DIR = path.join(ROOT, 'node_modules', '.cache', 'orientry');

/**
 * Bundles `entry` (relative to the repository root) and returns its module namespace.
 * @param {string} entry
 * @returns {Promise<Record<string, any>>}
 */
export async function importTs(entry) {
  fs.mkdirSync(CACHE_DIR, { recursive: true });
  // One file per process, so two scripts running at once never import each other's half-written bundle.
  const outfile = path.join(CACHE_DIR, `${path.basename(entry, '.ts')}-${process.pid}-${Date.now()}.mjs`);
  await build({
    entryPoints: [path.resolve(ROOT, entry)],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    alias: { $lib: path.join(ROOT, 'src', 'lib') },
    outfile,
    sourcemap: 'inline',
    logLevel: 'warning'
  });
  try {
    return await import(pathToFileURL(outfile).href);
  } finally {
    fs.rmSync(outfile, { force: true });
  }
}

/**
 * Prints an error the way scripts should: expected setup problems (errors with a dotted
 * `config.*` code) as their one-line message, anything else with its stack. Sets the exit code.
 * @param {unknown} error
 */
export function reportScriptError(error) {
  const code = error && typeof error === 'object' && 'code' in error ? String(error.code) : '';
  if (code.startsWith('config.')) console.error(/** @type {Error} */ (error).message);
  else console.error(error);
  process.exitCode = 1;
}

// Bundled into another script (the benchmarks bundle their imports), import.meta.url is that
// script's, which is also process.argv[1]: the file name tells this module's own run apart.
const ownPath = fileURLToPath(import.meta.url);
const invokedDirectly =
  path.basename(ownPath) === 'run-ts.js' && process.argv[1] && path.resolve(process.argv[1]) === ownPath;
if (invokedDirectly) {
  const [entry, exportName] = process.argv.slice(2);
  if (!entry || !exportName) {
    console.error('Usage: node scripts/run-ts.js <entry.ts> <exportedFunction>');
    process.exitCode = 2;
  } else {
    try {
      const module = await importTs(entry);
      if (typeof module[exportName] !== 'function')
        throw new Error(`${entry} has no exported function "${exportName}".`);
      const result = await module[exportName]();
      if (result !== undefined) console.log(JSON.stringify(result, null, 2));
    } catch (error) {
      reportScriptError(error);
    }
  }
}

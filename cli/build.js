/**
 * Bundles the command line into one file, cli/dist/orientry.js (`npm run build:cli`).
 *
 * Design notes: every npm dependency is bundled, so the single file runs after `npm i -g`
 * without node_modules beside it. Two things need help for that:
 * - draco3dgltf is CommonJS that calls `require('fs')` and reads `__dirname` when it loads; the
 *   banner gives the ESM bundle a real `require` and `__dirname`. It would then look for its
 *   .wasm beside the bundle, so cli/draco-wasm.ts is swapped for a module that embeds the bytes
 *   (esbuild's binary loader) and the decoder is created with `wasmBinary`.
 * - meshoptimizer's decoder already embeds its WebAssembly as text, so it bundles as is.
 */
import { build } from 'esbuild';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const outfile = resolve(root, 'cli/dist/orientry.js');

/** The bundle's view of the CommonJS globals that ESM lacks (names chosen not to collide). */
const banner = [
  '#!/usr/bin/env node',
  "import { createRequire as __orientryCreateRequire } from 'node:module';",
  "import { dirname as __orientryDirnameOf } from 'node:path';",
  "import { fileURLToPath as __orientryFileURLToPath } from 'node:url';",
  'const require = __orientryCreateRequire(import.meta.url);',
  'const __orientryFilename = __orientryFileURLToPath(import.meta.url);',
  'const __orientryDirname = __orientryDirnameOf(__orientryFilename);'
].join('\n');

/** Replaces cli/draco-wasm.ts with a module that embeds the decoder's .wasm bytes. */
const embedDracoWasm = {
  name: 'orientry-embed-draco-wasm',
  setup(builder) {
    builder.onResolve({ filter: /[\\/]draco-wasm(\.ts)?$/ }, () => ({
      path: 'draco-wasm',
      namespace: 'orientry-embedded'
    }));
    builder.onLoad({ filter: /.*/, namespace: 'orientry-embedded' }, () => ({
      contents: [
        "import wasm from 'draco3dgltf/draco_decoder_gltf.wasm';",
        'export async function loadDracoDecoderWasm() { return wasm; }'
      ].join('\n'),
      resolveDir: root,
      loader: 'js'
    }));
  }
};

const result = await build({
  entryPoints: [resolve(root, 'cli/main.ts')],
  outfile,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  banner: { js: banner },
  alias: { $lib: resolve(root, 'src/lib') },
  define: { __dirname: '__orientryDirname', __filename: '__orientryFilename' },
  loader: { '.wasm': 'binary' },
  plugins: [embedDracoWasm],
  legalComments: 'eof',
  logLevel: 'warning',
  write: false
});
// Write beside and rename: two builds at once (parallel test files) never leave a torn file.
const [bundle] = result.outputFiles.filter((file) => file.path === outfile);
const temporaryPath = `${outfile}.${process.pid}.tmp`;
await mkdir(dirname(outfile), { recursive: true });
await writeFile(temporaryPath, bundle.contents, { mode: 0o755 });
await rename(temporaryPath, outfile);

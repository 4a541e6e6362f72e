/**
 * GET /cli/orientry.js: the bundled command line, so a CI job can fetch the exact CLI that
 * matches this server (`curl -fsSLo orientry.js https://<server>/cli/orientry.js`). Public, no
 * sign-in: the bundle holds no secret. Cached for five minutes and revalidated by its content
 * hash (ETag), so a rebuilt CLI reaches clients soon without each job downloading it again.
 */
import { Readable } from 'node:stream';
import { apiError } from '$lib/server/ingest/api-error';
import { APP_VERSION } from '$lib/server/app-version';
import { CLI_BUNDLE_PATH, matchesEtag, openCliBundle } from './cli-bundle.server';
import type { RequestHandler } from './$types';

/** The CLI bundle, 304 when the client's copy is current, 404 when it was never built. */
export const GET: RequestHandler = async ({ request }) => {
  const bundle = await openCliBundle();
  if (!bundle) {
    return apiError(
      404,
      'cli.not-built',
      `The command line bundle (${CLI_BUNDLE_PATH}) has not been built on this server. ` +
        'Run `npm run build:cli` (or `npm run build`, which builds it too) in the server folder.'
    );
  }
  const headers = {
    'content-type': 'text/javascript; charset=utf-8',
    etag: bundle.etag,
    'cache-control': 'public, max-age=300',
    'x-orientry-version': APP_VERSION
  };
  if (matchesEtag(request.headers.get('if-none-match'), bundle.etag)) {
    await bundle.handle.close();
    return new Response(null, { status: 304, headers });
  }
  // The stream closes the handle when it ends or is torn down.
  const stream = bundle.handle.createReadStream({ start: 0 });
  return new Response(Readable.toWeb(stream) as ReadableStream<Uint8Array>, {
    headers: { ...headers, 'content-length': String(bundle.byteLength) }
  });
};

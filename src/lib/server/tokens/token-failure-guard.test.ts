import type { RequestEvent } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { TOKEN_FAILURE_LIMIT, tokenFailureGuard } from './token-failure-guard';

/** Runs the guard for one request from `address`; the route behind it answers `status`. */
async function call(path: string, address: string, authorization: string | null, status = 401) {
  let reachedRoute = false;
  const headers: Record<string, string> = authorization ? { authorization } : {};
  const event = {
    url: new URL(`http://orientry.test${path}`),
    request: new Request(`http://orientry.test${path}`, { headers }),
    getClientAddress: () => address
  } as unknown as RequestEvent;
  const response = await tokenFailureGuard({
    event,
    resolve: async () => {
      reachedRoute = true;
      return new Response(null, { status });
    }
  });
  return { response, reachedRoute };
}

describe('tokenFailureGuard', () => {
  it('answers 429 with Retry-After after 20 refused tokens from one address, before the route runs', async () => {
    for (let attempt = 0; attempt < TOKEN_FAILURE_LIMIT.maxFailures; attempt++) {
      expect((await call('/api/v1/projects/reef/builds', '10.0.0.1', 'Bearer ort_guess')).response.status).toBe(401);
    }
    const blocked = await call('/api/v1/projects/reef/builds', '10.0.0.1', 'Bearer ort_right', 201);
    expect(blocked.reachedRoute).toBe(false);
    expect(blocked.response.status).toBe(429);
    const retryAfter = Number(blocked.response.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(TOKEN_FAILURE_LIMIT.windowSeconds);
    expect(((await blocked.response.json()) as { error: { code: string } }).error.code).toBe('auth.token-rate-limited');
  });

  it('counts each address on its own', async () => {
    for (let attempt = 0; attempt < TOKEN_FAILURE_LIMIT.maxFailures; attempt++) {
      await call('/api/v1/projects/reef/builds', '10.0.0.2', 'Bearer ort_guess');
    }
    expect((await call('/api/v1/projects/reef/builds', '10.0.0.3', 'Bearer ort_right', 201)).response.status).toBe(201);
  });

  it('counts neither requests without a token nor answers other than 401', async () => {
    for (let attempt = 0; attempt < TOKEN_FAILURE_LIMIT.maxFailures + 5; attempt++) {
      await call('/api/v1/projects/reef/builds', '10.0.0.4', null);
      await call('/api/v1/projects/reef/builds', '10.0.0.4', 'Bearer ort_revoked', 403);
      await call('/projects/reef', '10.0.0.4', 'Bearer ort_guess', 401);
    }
    expect((await call('/api/v1/projects/reef/builds', '10.0.0.4', 'Bearer ort_right', 201)).response.status).toBe(201);
  });
});

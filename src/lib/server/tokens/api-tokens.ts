/**
 * Project API tokens: the credentials CI uses to submit builds. Import as a namespace:
 * `apiTokens.create(...)`, `apiTokens.verify(...)`. The secret is returned once by `create`;
 * only its SHA-256 and a short prefix are stored.
 */
import { ApiToken, type ApiTokenScope } from '../db/models/api-token';
import { ApiError } from '../ingest/api-error';
import { queueSqliteWrite } from '../ingest/sqlite-write-queue';
import { generateTokenSecret, hashTokenSecret, isTokenSecretShape, secretMatchesHash } from './token-secret';

/** A token as lists show it: never the secret or its hash. */
export interface TokenSummary {
  id: number;
  name: string;
  prefix: string;
  scopes: ApiTokenScope[];
  createdById: number | null;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** A new token with its secret, which is never shown again. */
export interface CreatedToken extends TokenSummary {
  secret: string;
}

/** Creates a `submit` token for a project and returns it with its secret. */
export async function create(projectId: number, name: string, createdById: number | null): Promise<CreatedToken> {
  const { secret, hash, prefix } = generateTokenSecret();
  const token = await ApiToken.create({ projectId, name, tokenHash: hash, prefix, scopes: 'submit', createdById });
  return { ...summarize(token), secret };
}

/** The project's tokens, newest first, revoked ones included (they show as revoked). */
export async function list(projectId: number): Promise<TokenSummary[]> {
  const tokens = await ApiToken.findAll({ where: { projectId }, order: [['id', 'DESC']] });
  return tokens.map(summarize);
}

/**
 * Revokes a token of the project; revoking twice keeps the first time.
 * @throws ApiError 404 `token.not-found` when the project has no token with this id.
 */
export async function revoke(projectId: number, tokenId: number): Promise<TokenSummary> {
  const token = await ApiToken.findOne({ where: { id: tokenId, projectId } });
  if (!token) {
    throw new ApiError(404, 'token.not-found', `This project has no API token ${tokenId}. Reload the token list.`);
  }
  if (!token.revokedAt) await token.update({ revokedAt: new Date() });
  return summarize(token);
}

/**
 * Checks an `Authorization` header value for a project and scope, and records the use.
 * @throws ApiError 401 `auth.token-missing` / `auth.token-invalid` when there is no usable
 *   secret, 403 `auth.token-revoked`, `auth.token-wrong-project` or `auth.token-scope` when the
 *   token exists but may not do this.
 */
export async function verify(
  authorization: string | null,
  project: { id: number; slug: string },
  scope: ApiTokenScope
): Promise<ApiToken> {
  const match = /^Bearer\s+(\S+)\s*$/i.exec(authorization ?? '');
  if (!match) {
    throw new ApiError(
      401,
      'auth.token-missing',
      'Authorization: send "Authorization: Bearer <token>" with a project API token. A project lead creates one under the project settings.'
    );
  }
  const secret = match[1];
  const invalid = new ApiError(
    401,
    'auth.token-invalid',
    `Authorization: the API token ${secretLabel(secret)} is not known. Check the secret in your CI settings or ask a project lead for a new token.`
  );
  if (!isTokenSecretShape(secret)) throw invalid;
  const token = await ApiToken.findOne({ where: { tokenHash: hashTokenSecret(secret) } });
  // The look-up is by hash; comparing again in constant time keeps timing independent of the stored value.
  if (!token || !secretMatchesHash(secret, token.tokenHash)) throw invalid;
  if (token.revokedAt) {
    throw new ApiError(
      403,
      'auth.token-revoked',
      `Authorization: the API token ${token.prefix}… ("${token.name}") was revoked. Ask a project lead for a new token.`
    );
  }
  if (token.projectId !== project.id) {
    throw new ApiError(
      403,
      'auth.token-wrong-project',
      `Authorization: the API token ${token.prefix}… belongs to another project, not "${project.slug}". Use the token of this project.`
    );
  }
  if (!token.scopes.split(',').includes(scope)) {
    throw new ApiError(
      403,
      'auth.token-scope',
      `Authorization: the API token ${token.prefix}… lacks the "${scope}" scope.`
    );
  }
  await stampUse(token);
  return token;
}

/** Lists show when a token was last used to the minute; a busy CI token is written at most once a minute. */
const STAMP_INTERVAL_MS = 60_000;

/** Records the use, queued with ingestion's other SQLite writes (see sqlite-write-queue.ts). */
async function stampUse(token: ApiToken): Promise<void> {
  const now = new Date();
  if (token.lastUsedAt && now.getTime() - token.lastUsedAt.getTime() < STAMP_INTERVAL_MS) return;
  await queueSqliteWrite(token.sequelize, () => token.update({ lastUsedAt: now }, { silent: true }));
}

function summarize(token: ApiToken): TokenSummary {
  return {
    id: token.id,
    name: token.name,
    prefix: token.prefix,
    scopes: token.scopes.split(',') as ApiTokenScope[],
    createdById: token.createdById,
    createdAt: token.createdAt.toISOString(),
    lastUsedAt: token.lastUsedAt?.toISOString() ?? null,
    revokedAt: token.revokedAt?.toISOString() ?? null
  };
}

/** The first characters of a presented secret for messages: enough to recognise, too few to use. */
function secretLabel(secret: string): string {
  return secret.length > 12 ? `"${secret.slice(0, 12)}…"` : 'sent';
}

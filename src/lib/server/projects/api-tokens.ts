import { ApiToken } from '../db/models';
import { generateTokenSecret } from '../tokens/token-secret';

/** A token just made: the row (hash and prefix only) and the secret, which is shown once and never stored. */
export interface CreatedApiToken {
  token: ApiToken;
  secret: string;
}

/**
 * Makes a CI token for a project with the `submit` scope. The caller shows `secret` once;
 * the database keeps only its SHA-256 and display prefix.
 */
export async function createApiToken(input: {
  projectId: number;
  name: string;
  createdById: number | null;
}): Promise<CreatedApiToken> {
  const { secret, hash, prefix } = generateTokenSecret();
  const token = await ApiToken.create({
    projectId: input.projectId,
    name: input.name,
    createdById: input.createdById,
    tokenHash: hash,
    prefix,
    scopes: 'submit'
  });
  return { token, secret };
}

/** Revokes a token from now on; a revoked token is refused but stays listed for history. */
export async function revokeApiToken(token: ApiToken): Promise<void> {
  if (token.revokedAt) return;
  token.revokedAt = new Date();
  await token.save();
}

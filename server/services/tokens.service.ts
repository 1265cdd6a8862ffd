import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { notFound } from '../errors';
import type { TokensRepository } from '../repositories/tokens.repository';

export const TOKEN_PREFIX = 'coh_';
const hashOf = (token: string) => createHash('sha256').update(token).digest('hex');

/**
 * Personal API tokens (`Authorization: Bearer coh_…`). A token is 32 random
 * bytes, shown once; a SHA-256 of it is stored (enough for a secret of this
 * entropy, common practice). Scopes: `read` (GET requests) and `deposit`
 * (also the lab's deposit routes). Kept in our own table so scopes follow our
 * route rules; better-auth's sessions stay for browsers.
 */
export function createTokensService({ tokens }: { tokens: TokensRepository }) {
  return {
    async create(userId: string, name: string, scopes: Array<'read' | 'deposit'>) {
      const token = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
      const id = randomUUID();
      const unique = [...new Set<'read' | 'deposit'>(['read', ...scopes])];
      await tokens.insert({ id, userId, name, prefix: token.slice(0, 10), tokenHash: hashOf(token), scopes: unique });
      return { id, name, scopes: unique, token };
    },
    async list(userId: string) {
      return (await tokens.listFor(userId)).map((t) => ({
        id: t.id,
        name: t.name,
        prefix: t.prefix,
        scopes: t.scopes,
        createdAt: t.createdAt.toISOString(),
        lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
        revokedAt: t.revokedAt?.toISOString() ?? null,
      }));
    },
    async revoke(userId: string, id: string) {
      if (!(await tokens.revoke(userId, id))) throw notFound('The token');
    },
    /** The owner and scopes of a bearer token, or null. */
    async authenticate(token: string) {
      if (!token.startsWith(TOKEN_PREFIX)) return null;
      const found = await tokens.findActive(hashOf(token));
      if (!found) return null;
      void tokens.touch(found.token.id).catch(() => undefined);
      return { user: found.user, scopes: found.token.scopes };
    },
  };
}

export type TokensService = ReturnType<typeof createTokensService>;

import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '@/db/client';
import { apiTokens, users } from '@/db/schema';
import { newId, randomSecret, sha256 } from '@/lib/auth/secrets';
import { notFound } from '@/lib/http/errors';
import { plainText } from '@/lib/schemas/text';
import type { PublicUser } from './users';

export const createTokenSchema = z.object({
  name: plainText({ max: 120 }).min(1, 'Name the token.'),
});

const TOKEN_PREFIX = 'lw_';

/** Creates a personal API token; the secret is returned once and stored only as a hash. */
export async function createToken(userId: string, name: string) {
  const token = `${TOKEN_PREFIX}${randomSecret(30)}`;
  const id = newId();
  await db
    .insert(apiTokens)
    .values({ id, userId, name, tokenHash: sha256(token), prefix: token.slice(0, 10) });
  return { id, name, token, prefix: token.slice(0, 10) };
}

export async function listTokens(userId: string) {
  const rows = await db
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
    })
    .from(apiTokens)
    .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .orderBy(desc(apiTokens.createdAt));
  return rows.map((r) => ({
    ...r,
    createdAt: r.createdAt.toISOString(),
    lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
  }));
}

export async function revokeToken(userId: string, tokenId: string) {
  const res = await db
    .update(apiTokens)
    .set({ revokedAt: sql`NOW()` })
    .where(
      and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)),
    );
  if (res[0].affectedRows === 0) throw notFound('Token');
}

/** The owner of a live token, or null for an unknown or revoked one. */
export async function userForToken(token: string): Promise<PublicUser | null> {
  if (!token.startsWith(TOKEN_PREFIX)) return null;
  const [row] = await db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      siteRole: users.siteRole,
      notifyRunEmails: users.notifyRunEmails,
      tokenId: apiTokens.id,
    })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(and(eq(apiTokens.tokenHash, sha256(token)), isNull(apiTokens.revokedAt)));
  if (!row) return null;
  await db
    .update(apiTokens)
    .set({ lastUsedAt: sql`NOW()` })
    .where(eq(apiTokens.id, row.tokenId));
  const { tokenId: _, ...user } = row;
  void _;
  return user;
}

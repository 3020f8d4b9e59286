import crypto from 'node:crypto';

/** A URL-safe random secret (tokens, invitation and reset links). */
export const randomSecret = (bytes = 32) => crypto.randomBytes(bytes).toString('base64url');

/** Secrets are stored only as their SHA-256 hash. */
export const sha256 = (s: string) => crypto.createHash('sha256').update(s).digest('hex');

export const newId = () => crypto.randomUUID();

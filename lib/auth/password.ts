import crypto from 'node:crypto';
import bcrypt from 'bcryptjs';

const COST = 10;
/**
 * bcrypt reads only the first 72 bytes of its input, so a password is first reduced to its
 * SHA-256 digest (44 base64 characters) and the stored hash is marked with this version.
 * Hashes without the marker are plain bcrypt of the password, from before the change.
 */
const PREHASHED = 'lw1$';

const prehash = (password: string) =>
  crypto.createHash('sha256').update(password, 'utf8').digest('base64');

export const hashPassword = async (password: string) =>
  PREHASHED + (await bcrypt.hash(prehash(password), COST));

// A real hash of a random string, compared against when the address is unknown, so an unknown
// address costs the same time as a wrong password.
const DUMMY_HASH = PREHASHED + bcrypt.hashSync(prehash('lanewise-no-such-user'), COST);

/** True when `hash` is of the old kind and should be replaced after a successful sign-in. */
export const needsRehash = (hash: string) => !hash.startsWith(PREHASHED);

export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  const stored = hash ?? DUMMY_HASH;
  const ok = stored.startsWith(PREHASHED)
    ? await bcrypt.compare(prehash(password), stored.slice(PREHASHED.length))
    : await bcrypt.compare(password, stored);
  return hash !== null && ok;
}

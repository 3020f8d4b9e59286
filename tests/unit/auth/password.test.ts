import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { hashPassword, needsRehash, verifyPassword } from '@/lib/auth/password';

describe('password hashing', () => {
  // bcrypt uses only the first 72 bytes of its key (Provos & Mazières 1999, §6.1).
  const common = 'ä'.repeat(36); // 72 bytes in UTF-8
  const a = `${common}-first-ending`;
  const b = `${common}-other-ending`;

  it('tells apart passwords that agree in their first 72 bytes', async () => {
    expect(bcrypt.compareSync(b, bcrypt.hashSync(a, 4))).toBe(true); // plain bcrypt cannot
    const hash = await hashPassword(a);
    expect(await verifyPassword(a, hash)).toBe(true);
    expect(await verifyPassword(b, hash)).toBe(false);
  });

  it('still verifies hashes made before pre-hashing, and marks them for replacement', async () => {
    const legacy = bcrypt.hashSync('correct-horse-battery', 4);
    expect(await verifyPassword('correct-horse-battery', legacy)).toBe(true);
    expect(await verifyPassword('correct-horse-batter', legacy)).toBe(false);
    expect(needsRehash(legacy)).toBe(true);
    expect(needsRehash(await hashPassword('correct-horse-battery'))).toBe(false);
  });

  it('fits the 100-character column and never matches an unknown account', async () => {
    expect((await hashPassword('x'.repeat(200))).length).toBeLessThanOrEqual(100);
    expect(await verifyPassword('lanewise-no-such-user', null)).toBe(false);
  });
});

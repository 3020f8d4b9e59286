import bcrypt from 'bcryptjs';

const COST = 10;
// A real hash of a random string, compared against when the address is unknown, so an unknown
// address costs the same time as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('lanewise-no-such-user', COST);

export const hashPassword = (password: string) => bcrypt.hash(password, COST);

export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  const ok = await bcrypt.compare(password, hash ?? DUMMY_HASH);
  return hash !== null && ok;
}

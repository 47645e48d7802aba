// Password hashing with bcryptjs, and a constant-work check for unknown accounts so response time
// does not reveal which e-mails exist.
import bcrypt from 'bcryptjs';

let dummyHash: string | undefined;

export async function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

/** Compares against the hash, or against a throwaway hash when there is none (same cost either way). */
export async function checkPassword(password: string, hash: string | null, cost: number): Promise<boolean> {
  if (hash) return bcrypt.compare(password, hash);
  dummyHash ??= await bcrypt.hash('no account has this password', cost);
  await bcrypt.compare(password, dummyHash);
  return false;
}

import 'server-only';
import bcrypt from 'bcryptjs';

/** bcrypt cost factor (2^11 rounds); common practice, no source: 10–12 for interactive sign-in. */
export const bcryptCost = 11;

/** A bcrypt hash of the password. */
export async function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, bcryptCost);
}

// Compared against when the e-mail is unknown, so both cases take the same time.
const unknownUserHash = bcrypt.hashSync('no account has this password', bcryptCost);

/** True when the password matches the hash; with a null hash it still spends the same time. */
export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  const matches = await bcrypt.compare(password, hash ?? unknownUserHash);
  return hash !== null && matches;
}

import bcrypt from 'bcryptjs';

const ROUNDS = Number(process.env.CAGEWRIGHT_BCRYPT_ROUNDS ?? 10);

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, ROUNDS);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

// Compared against when the e-mail is unknown, so both paths take the same time.
export const DECOY_HASH = '$2b$10$enzEHR.u5HaGUQOsSiPUjOVBPRbRjoIMhujPMAZW2SBQz9iykEv.e';

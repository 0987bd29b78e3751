import bcrypt from "bcryptjs";

export const BCRYPT_COST = 10;
export const PASSWORD_MIN_LENGTH = 10;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/** A real hash of nothing anyone knows, so unknown accounts cost the same time as wrong passwords. */
export const DUMMY_HASH = "$2b$10$ggnEkpt5rgGXFUon9FD4Cew5NUAnfRFS8NWvfIJxmtdFdMr7SjX32";

import { hash, verify } from '@node-rs/argon2';

/** Argon2id with the library's defaults (memory-hard; parameters are stored in the hash). */
export const hashPassword = (password: string) => hash(password);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

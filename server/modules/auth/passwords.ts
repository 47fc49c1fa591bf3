import * as argon2 from "argon2";

// argon2id with the library's defaults (64 MiB, 3 passes): deliberately slow.
export const hashPassword = (password: string) => argon2.hash(password, { type: argon2.argon2id });

// Verifying against a real hash when the account does not exist keeps both paths equally slow.
const dummyHash = hashPassword("dewline-no-such-account");

export async function verifyPassword(hash: string | null, password: string): Promise<boolean> {
  if (!hash) {
    await argon2.verify(await dummyHash, password).catch(() => false);
    return false;
  }
  return argon2.verify(hash, password).catch(() => false);
}

import bcrypt from "bcryptjs";

const COST = 11;

export const hashPassword = (password: string) => bcrypt.hash(password, COST);

// Compared against when no account matches, so the answer takes as long either way.
let dummyHash: Promise<string> | undefined;

export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  if (!hash) {
    await bcrypt.compare(password, await (dummyHash ??= bcrypt.hash("no account has this password", COST)));
    return false;
  }
  return bcrypt.compare(password, hash);
}

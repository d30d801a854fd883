import bcrypt from 'bcryptjs';

// 10 rounds costs about 70 ms here: slow enough against guessing, fast enough for sign-in and the test suite.
const BCRYPT_ROUNDS = 10;

// Compared against when the e-mail is unknown, so that answer takes as long as a wrong password.
const UNKNOWN_USER_HASH = bcrypt.hashSync('no user has this password', BCRYPT_ROUNDS);

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_ROUNDS);
}

/** Whether the password matches the hash; with no hash, spends the same time and says no. */
export async function passwordMatches(password: string, hash: string | undefined): Promise<boolean> {
  const matches = await bcrypt.compare(password, hash ?? UNKNOWN_USER_HASH);
  return matches && hash !== undefined;
}

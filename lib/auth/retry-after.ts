// How long to wait, in words: shared by the server's 429 answers and the sign-in form (no server imports).

export function retryAfterText(seconds: number): string {
  if (seconds < 90) return `${seconds} seconds`;
  return `${Math.ceil(seconds / 60)} minutes`;
}

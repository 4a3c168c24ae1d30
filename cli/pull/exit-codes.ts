/**
 * Exit codes of `cli pull`, one per kind of failure a build script may want to react to differently
 * (retry later on 6, rotate the token on 3, fail the build on 5). Listed in the command's --help.
 */
export const EXIT = {
  ok: 0,
  other: 1,
  usage: 2,
  auth: 3,
  notFound: 4,
  checksum: 5,
  network: 6,
} as const;
export type ExitCode = (typeof EXIT)[keyof typeof EXIT];

/** A failure with the exit code it maps to; `message` is one line for stderr. */
export class PullError extends Error {
  constructor(readonly exitCode: ExitCode, message: string) {
    super(message);
    this.name = 'PullError';
  }
}

export const EXIT_HELP = [
  'Exit codes:',
  '  0  every requested file is current (downloaded or unchanged)',
  '  1  anything else (unexpected answer from the server, rate limit still hit after retries, disk error)',
  '  2  usage error (the message names the flag)',
  '  3  authentication failed (401/403: token missing, wrong, revoked, or not allowed this pack)',
  '  4  not found (404 for the team, pack or channel; or the target/format is not in the manifest)',
  '  5  checksum mismatch (the bytes do not hash to the SHA-256 of the manifest; the old file is kept)',
  '  6  network failure (connection refused, timeout, or 502/503/504; after retries with backoff)',
].join('\n');

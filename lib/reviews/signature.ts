import { createHash } from 'node:crypto';

/** What is signed: the exact revisions and their angles, as a SHA-256 digest. */
export function signedDigest(
  rows: readonly { analysisId: string; leftDeg: number; rightDeg: number }[],
): string {
  const canonical = rows
    .map((r) => `${r.analysisId}:${r.leftDeg}:${r.rightDeg}`)
    .sort()
    .join('\n');
  return createHash('sha256').update(canonical).digest('hex');
}

/** Days in milliseconds. */
const DAY_MS = 86_400_000;

/** Days from treatment to measurement; null when the sample has no treatment time. */
export function ageInDays(measuredAt: string, treatedAt: string | null): number | null {
  if (!treatedAt) return null;
  return (Date.parse(measuredAt) - Date.parse(treatedAt)) / DAY_MS;
}

/**
 * The age-window rule of a spec, shared by the compare and surface-energy pages: without a
 * window every drop counts; with one, a drop counts when it was measured at most `maxDays` after
 * its sample's treatment. Drops without a treatment time do not count.
 */
export function countsInWindow(maxDays: number | null, ageDays: number | null): boolean {
  if (maxDays === null) return true;
  return ageDays !== null && ageDays <= maxDays;
}

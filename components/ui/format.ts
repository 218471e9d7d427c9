/** Display helpers shared by the client screens (exports keep full precision). */

/** A figure with fixed decimals; '—' for a missing or non-finite value. */
export const fmt = (value: number | null | undefined, digits = 1): string =>
  value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(digits);

/** "14 Mar 2026, 09:30 UTC": an instant for reading, the same for every visitor. */
export const fmtUtc = (iso: string | Date): string =>
  new Intl.DateTimeFormat('en-GB', {
    dateStyle: 'medium',
    timeStyle: 'short',
    timeZone: 'UTC',
  }).format(new Date(iso)) + ' UTC';

/** Display helpers shared by the record tables (the CSV keeps full precision). */
export const fmtNumber = (value: number | null | undefined, digits = 1): string =>
  value === null || value === undefined ? '—' : value.toFixed(digits);

export const fmtDate = (value: Date | string | null | undefined): string =>
  value ? new Date(value).toISOString().slice(0, 10) : '—';

export const fmtDateTime = (value: Date | string | null | undefined): string =>
  value ? new Date(value).toISOString().slice(0, 16).replace('T', ' ') + ' UTC' : '—';

const DAY_MS = 86_400_000;

/** "3.2 d" since treatment. */
export const fmtSince = (value: Date | string | null | undefined, now = Date.now()): string => {
  if (!value) return '—';
  const days = (now - new Date(value).getTime()) / DAY_MS;
  if (days < 1) return `${(days * 24).toFixed(1)} h`;
  return `${days.toFixed(1)} d`;
};

/** datetime-local value (the browser's time zone) of a stored instant. */
export function toLocalInput(value: Date | string | null | undefined): string {
  if (!value) return '';
  const date = new Date(value);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

/** A datetime-local value → ISO 8601 with offset (what the schemas take); other text as is. */
export function fromLocalInput(value: unknown): unknown {
  if (typeof value !== 'string' || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(value))
    return value;
  const date = new Date(value);
  return Number.isNaN(date.getTime()) ? value : date.toISOString();
}

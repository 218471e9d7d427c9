import { randomBytes } from 'node:crypto';

/** Random, URL-safe identifiers (120 bits). */
export function newId(): string {
  return randomBytes(15).toString('base64url');
}

export function slugify(name: string): string {
  const base = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);
  return base || 'lab';
}

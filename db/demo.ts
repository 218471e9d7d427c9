/**
 * The invented demo organization of the product brief. Local use only: the password is printed
 * by `npm start` and must never be used on a server that others can reach.
 */
export const DEMO_ORGANIZATION = { name: 'Kestrel Surface Works', slug: 'kestrel-surface-works' };

export const DEMO_PASSWORD = 'beadline-demo-2026';

export const DEMO_USERS = [
  { email: 'admin@kestrel.example', name: 'Mara Lindqvist', role: 'admin' },
  { email: 'analyst@kestrel.example', name: 'Tobiah Renner', role: 'analyst' },
  { email: 'reviewer@kestrel.example', name: 'Ines Okafor', role: 'reviewer' },
  { email: 'viewer@kestrel.example', name: 'Colm Hartigan', role: 'viewer' },
] as const;

import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_USERS } from '../db/demo';

const url = process.env.APP_URL ?? `http://127.0.0.1:${process.env.PORT ?? '3000'}`;
const lines = [
  '',
  `  Beadline is running at ${url}`,
  '',
  `  Demo organization: ${DEMO_ORGANIZATION.name} (invented; local use only)`,
  ...DEMO_USERS.map((u) => `    ${u.role.padEnd(9)} ${u.email}`),
  `  Password for every demo login: ${DEMO_PASSWORD}`,
  '  (for this local demo only; never expose it on a network)',
  '',
  '  Press Ctrl+C to stop Beadline and the services it started.',
  '',
];
console.log(lines.join('\n'));

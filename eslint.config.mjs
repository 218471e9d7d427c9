import nextCoreWebVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';

/*
 * The layers (DEVELOPERS.md): app/ and components/ on top, then the services in server/, then
 * db/queries and the pure core in lib/. Imports point down only; each block below forbids the
 * imports that would point up or sideways for the files it names. A violation fails `npm test`
 * (its lint step); tests/unit/architecture/boundaries.test.ts proves the rules fire.
 */

const DB = ['@/db', '@/db/**', '../db/*', '../../db/*', '../../../db/*'];
const SERVER = ['@/server', '@/server/**', '../server/*', '../../server/*', '../../../server/*'];
const APP = ['@/app', '@/app/**'];
const COMPONENTS = ['@/components', '@/components/**'];
const FRAMEWORK = ['next', 'next/*', 'react', 'react/*', 'react-dom', 'react-dom/*'];

const restrict = (...groups) => [
  'error',
  { patterns: groups.map(([group, message]) => ({ group, message })) },
];

/** The pure core: computation and contracts that run anywhere (browser, worker, Node, tests). */
const CORE = [
  'lib/analysis/**',
  'lib/stats/**',
  'lib/surface-energy/**',
  'lib/tensiometry/**',
  'lib/compare/**',
  'lib/csv/**',
  'lib/contracts/**',
  'lib/measure/**',
  'lib/dynamic/**',
  'lib/compute/**',
];

/** Node-only pieces of the core (decoding files, running ffmpeg) live in a node/ folder. */
const CORE_NODE = ['lib/*/node/**'];
const NODE = [
  'node:*',
  ...[
    'fs',
    'path',
    'child_process',
    'os',
    'crypto',
    'url',
    'util',
    'stream',
    'worker_threads',
  ].flatMap((name) => [name, `${name}/*`]),
  'sharp',
  '**/node/*',
];

const coreGroups = [
  [
    DB,
    'The pure core does not read the database; a service in server/ does, and passes plain data in.',
  ],
  [SERVER, 'The pure core does not call services; services call the core.'],
  [[...APP, ...COMPONENTS], 'The pure core knows nothing of pages or components.'],
  [FRAMEWORK, 'The pure core runs without Next.js or React (web worker, CLI, tests).'],
  [
    ['@/lib/auth/*', '!@/lib/auth/permissions', '@/lib/email/*', '@/lib/uploads/*', '@/lib/api/*'],
    'The pure core uses no integration (auth, mail, uploads); only the permissions table is plain data.',
  ],
];

const boundaries = [
  // lib/ first: the core's stricter block below replaces it for the core's files.
  {
    files: ['lib/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': restrict(
        [SERVER, 'lib/ does not call services; a service calls lib/.'],
        [[...APP, ...COMPONENTS], 'lib/ knows nothing of pages or components.'],
      ),
    },
  },
  {
    files: CORE.map((glob) => `${glob}/*.{ts,tsx}`),
    rules: { 'no-restricted-imports': restrict(...coreGroups) },
  },
  // The same for the core outside its node/ folders, which also runs in the browser and the web
  // worker: no Node built-ins, no sharp, nothing from a node/ folder.
  {
    files: CORE.map((glob) => `${glob}/*.{ts,tsx}`),
    ignores: CORE_NODE,
    rules: {
      'no-restricted-imports': restrict(...coreGroups, [
        NODE,
        'This part of the core runs in the browser and the web worker too; Node-only code goes in a node/ folder (lib/analysis/node, lib/dynamic/node).',
      ]),
    },
  },
  {
    files: ['db/**/*.ts'],
    rules: {
      'no-restricted-imports': restrict(
        [SERVER, 'db/ is data access: services call queries, never the other way round.'],
        [[...APP, ...COMPONENTS], 'db/ knows nothing of pages or components.'],
        [
          [
            '@/lib/email/*',
            '@/lib/compare',
            '@/lib/compare/*',
            '@/lib/api/*',
            '@/lib/reports/*',
            '@/lib/alerts/*',
          ],
          'A query returns rows; mail, comparisons, reports and alerts are put together by a service in server/.',
        ],
      ),
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': restrict([
        [...APP, ...COMPONENTS],
        'Services answer route handlers, server actions and pages; they do not import them.',
      ]),
    },
  },
  {
    files: ['app/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': restrict([
        DB,
        'Pages, route handlers and server actions call a service in server/, never db/ (neither the client nor queries).',
      ]),
    },
  },
  {
    files: ['components/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': restrict(
        [DB, 'Components get data from pages (props) and the API; types come from lib/contracts.'],
        [SERVER, 'Components run in the browser; services are server-only.'],
      ),
    },
  },
];

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
    },
  },
  ...boundaries,
  {
    ignores: [
      'node_modules/**',
      '.next/**',
      '.next-*/**',
      '.data/**',
      'next-env.d.ts',
      'db/migrations/**',
    ],
  },
];

export default config;

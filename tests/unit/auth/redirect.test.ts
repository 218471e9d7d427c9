import { describe, expect, it } from 'vitest';
import { safeRedirectPath } from '@/lib/auth/redirect';

describe('safeRedirectPath', () => {
  it.each([
    ['/batches', '/batches'],
    ['/compare?coating=HT-200&batches=a,b', '/compare?coating=HT-200&batches=a,b'],
    ['/batches/abc#samples', '/batches/abc#samples'],
    ['/batches/../audit', '/audit'],
    ['/a%20b', '/a%20b'],
  ])('keeps the path %j of this site', (value, expected) => {
    expect(safeRedirectPath(value)).toBe(expected);
  });

  it.each([
    undefined,
    null,
    42,
    '',
    '//evil.example',
    '/\\evil.example',
    '/\t/evil.example',
    '/%09/evil.example',
    '/%250909/evil.example',
    '/%5C%5Cevil.example',
    '/%2F/evil.example',
    '/.//evil.example',
    'https://evil.example',
    'HTTPS://127.0.0.1:3000/x',
    'mailto:a@evil.example',
    '/%E0%A4%A',
    `/${'a'.repeat(3000)}`,
  ])('refuses %j', (value) => {
    expect(safeRedirectPath(value)).toBe('/dashboard');
    expect(safeRedirectPath(value, '/batches')).toBe('/batches');
  });
});

import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { migrationsFolder } from '@/db/migrate';

/*
 * drizzle's migrator applies exactly the journal's entries, in order; a SQL file the journal does
 * not name (two branches that each wrote a 0008_*, say) would never run. Every file and entry
 * must match one to one, numbered 0000, 0001, … without gaps, each with its snapshot.
 */

type Entry = { idx: number; tag: string; when: number };

const journal = JSON.parse(
  readFileSync(join(migrationsFolder, 'meta', '_journal.json'), 'utf8'),
) as { entries: Entry[] };
const sqlFiles = readdirSync(migrationsFolder)
  .filter((name) => name.endsWith('.sql'))
  .sort();

describe('the migrations journal', () => {
  it('names every SQL file once, in order, numbered from 0000 without gaps', () => {
    expect(journal.entries.map((entry) => `${entry.tag}.sql`)).toEqual(sqlFiles);
    journal.entries.forEach((entry, index) => {
      expect(entry.idx, entry.tag).toBe(index);
      expect(entry.tag.slice(0, 5), entry.tag).toBe(`${String(index).padStart(4, '0')}_`);
    });
  });

  it('keeps the order in time and a snapshot for each migration', () => {
    for (let i = 1; i < journal.entries.length; i++) {
      expect(journal.entries[i]!.when, journal.entries[i]!.tag).toBeGreaterThan(
        journal.entries[i - 1]!.when,
      );
    }
    for (const entry of journal.entries) {
      const snapshot = join(migrationsFolder, 'meta', `${entry.tag.slice(0, 4)}_snapshot.json`);
      expect(existsSync(snapshot), snapshot).toBe(true);
    }
  });
});

import { describe, expect, it } from 'vitest';
import { compareSearch, parseCompareQuery } from '@/lib/compare';

describe('compare URL', () => {
  it('reads comma-separated and repeated batches', () => {
    expect(parseCompareQuery(new URLSearchParams('coating=HT-200&batches=B-0411,B-0412&batches=B-0410&ref=B-0408'))).toEqual({
      coating: 'HT-200',
      batches: ['B-0411', 'B-0412', 'B-0410'],
      ref: 'B-0408',
    });
    expect(parseCompareQuery({ coating: ['HT-200', 'X'], batches: 'B-1, ,B-1' })).toEqual({
      coating: 'HT-200',
      batches: ['B-1'],
      ref: null,
    });
  });

  it('drops empty values instead of failing', () => {
    expect(parseCompareQuery(new URLSearchParams('coating=&batches=&ref=%20'))).toEqual({
      coating: null,
      batches: [],
      ref: null,
    });
  });

  it('writes the same choices back', () => {
    const query = { coating: 'HT-200', batches: ['B-0411', 'B-0412'], ref: 'B-0408' };
    const search = compareSearch(query);
    expect(search).toBe('?coating=HT-200&batches=B-0411%2CB-0412&ref=B-0408');
    expect(parseCompareQuery(new URLSearchParams(search.slice(1)))).toEqual(query);
    expect(compareSearch({ coating: null, batches: [], ref: null })).toBe('');
  });
});

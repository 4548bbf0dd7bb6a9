import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { SubjectIndex } from './subject-index';

const h = (s: string) => createHash('sha256').update(s).digest();

describe('SubjectIndex', () => {
  it('reports the first line of a repeated subject and 0 for new ones, across growth', () => {
    const index = new SubjectIndex();
    for (let i = 0; i < 50_000; i++) expect(index.add(h(`id-${i}`), i + 2)).toBe(0);
    expect(index.size).toBe(50_000);
    expect(index.add(h('id-0'), 60_000)).toBe(2);
    expect(index.add(h('id-49999'), 60_001)).toBe(50_001);
    expect(index.add(h('someone-else'), 60_002)).toBe(0);
  });
});

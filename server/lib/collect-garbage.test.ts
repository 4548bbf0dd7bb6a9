import { describe, expect, it } from 'vitest';
import { collectGarbage } from './collect-garbage';

describe('collectGarbage', () => {
  it('frees an object nobody holds any more', async () => {
    const ref = (() => new WeakRef({ rows: new Array(10_000).fill(1) }))();
    // A WeakRef keeps its target until the current job ends.
    await new Promise((resolve) => setTimeout(resolve, 0));
    collectGarbage();
    expect(ref.deref()).toBeUndefined();
  });
});

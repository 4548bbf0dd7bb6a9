import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { pseudonym, pseudonymKey } from './pseudonym';
import { pseudonymsOnThread } from './pseudonym-thread';

describe('pseudonymsOnThread', () => {
  it('gives exactly pseudonym() of each value, in order, and HMAC-SHA-256 by RFC 2104', async () => {
    const secret = 'a secret for this test only';
    const values = ['HH-001', ' HH-002 ', 'ÅSA-3', ''];
    const [subjects, clusters] = await Promise.all([pseudonymsOnThread(secret, 'subject', 7, values), pseudonymsOnThread(secret, 'cluster', 7, values)]);
    expect(subjects.length).toBe(32 * values.length);
    values.forEach((v, i) => {
      expect(subjects.subarray(32 * i, 32 * i + 32)).toEqual(pseudonym(pseudonymKey(secret), 'subject', 7, v));
      expect(clusters.subarray(32 * i, 32 * i + 32)).toEqual(pseudonym(pseudonymKey(secret), 'cluster', 7, v));
    });
    // The identity behind `pseudonym()`: Node's HMAC over purpose, program and trimmed value.
    expect(subjects.subarray(32, 64)).toEqual(createHmac('sha256', secret).update('subject\u00007\u0000HH-002').digest());
    expect(await pseudonymsOnThread(secret, 'subject', 7, [])).toEqual(Buffer.alloc(0));
  });
});

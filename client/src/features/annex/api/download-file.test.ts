import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError } from '@/lib/api-client';
import { attachmentName, downloadFile } from './download-file';

afterEach(() => vi.unstubAllGlobals());

describe('downloadFile', () => {
  it('reads the file name the server gave', () => {
    expect(attachmentName('attachment; filename="cutline-annex-x-all-20261201.xlsx"', 'fallback.xlsx')).toBe('cutline-annex-x-all-20261201.xlsx');
    expect(attachmentName(null, 'fallback.xlsx')).toBe('fallback.xlsx');
  });

  it('turns a refusal into the server’s own plain message instead of saving it as a file', async () => {
    const body = { error: { code: 'no_primary_design', message: 'This program has no evaluation design yet, so there is no annex.' } };
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify(body), { status: 409, headers: { 'Content-Type': 'application/json' } })));
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click');
    const err = await downloadFile('/api/programs/1/annex', 'annex.xlsx').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({ status: 409, code: 'no_primary_design', message: body.error.message });
    expect(click).not.toHaveBeenCalled();
  });

  it('says so plainly when Cutline cannot be reached', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(downloadFile('/api/programs/1/annex', 'annex.xlsx')).rejects.toMatchObject({ code: 'network' });
  });
});

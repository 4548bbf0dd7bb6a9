import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { LocalIdentityProvider } from '../dev/local-idp/local-idp';
import { ensureSigningKeys } from '../dev/local-idp/signing-keys';
import { parseIdentityProviderMetadata, resolveExternalIdentityProvider } from './identity-provider';

describe('identity provider settings', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-idp-'));
  const keys = ensureSigningKeys(path.join(dir, 'keys'));
  const idp = new LocalIdentityProvider('http://127.0.0.1:9', keys);
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('reads entity ID, redirect sign-on URL and signing certificate from metadata', () => {
    const parsed = parseIdentityProviderMetadata(idp.metadataXml());
    expect(parsed.entityId).toBe('http://127.0.0.1:9/metadata');
    expect(parsed.ssoUrl).toBe('http://127.0.0.1:9/sso');
    expect(parsed.certificates?.[0]?.replace(/\s+/g, '')).toBe(keys.certificate.replace(/\s+/g, ''));
  });

  it('lets explicit values win over the metadata file, and names what is missing', async () => {
    const file = path.join(dir, 'metadata.xml');
    fs.writeFileSync(file, idp.metadataXml());
    const settings = await resolveExternalIdentityProvider({ kind: 'external', metadataFile: file, ssoUrl: 'https://idp.agency.example/sso' });
    expect(settings).toMatchObject({ entityId: 'http://127.0.0.1:9/metadata', ssoUrl: 'https://idp.agency.example/sso' });
    await expect(resolveExternalIdentityProvider({ kind: 'external', entityId: 'x', ssoUrl: 'https://idp.agency.example/sso' })).rejects.toThrow(
      /no signing certificate/,
    );
    expect(() => parseIdentityProviderMetadata('<nothing/>')).toThrow(/EntityDescriptor/);
  });
});

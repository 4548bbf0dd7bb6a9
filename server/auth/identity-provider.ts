import fs from 'node:fs';
import { DOMParser } from '@xmldom/xmldom';
import type { IdentityProviderSource } from '../config/env';

/** What Cutline needs to know about the identity provider to send people there and trust its answers. */
export interface IdentityProviderSettings {
  entityId: string;
  /** Single sign-on service, HTTP-Redirect binding. */
  ssoUrl: string;
  /** Signing certificates (PEM). Several are allowed so a provider can roll its key over. */
  certificates: string[];
}

const MD = 'urn:oasis:names:tc:SAML:2.0:metadata';
const DS = 'http://www.w3.org/2000/09/xmldsig#';
const REDIRECT = 'urn:oasis:names:tc:SAML:2.0:bindings:HTTP-Redirect';

/**
 * Reads the agency's identity provider from its metadata (URL or file) and the explicit
 * `CUTLINE_SAML_IDP_*` values, explicit values winning. Called once at start-up.
 * @throws Error saying which value is missing or unreadable
 */
export async function resolveExternalIdentityProvider(source: Extract<IdentityProviderSource, { kind: 'external' }>): Promise<IdentityProviderSettings> {
  let fromMetadata: Partial<IdentityProviderSettings> = {};
  if (source.metadataUrl) {
    const response = await fetch(source.metadataUrl, { signal: AbortSignal.timeout(15_000) }).catch((err: unknown) => {
      throw new Error(`Could not fetch the identity provider's metadata from CUTLINE_SAML_IDP_METADATA_URL: ${String(err)}`);
    });
    if (!response.ok) throw new Error(`The identity provider's metadata URL answered ${response.status}.`);
    fromMetadata = parseIdentityProviderMetadata(await response.text());
  } else if (source.metadataFile) {
    fromMetadata = parseIdentityProviderMetadata(fs.readFileSync(source.metadataFile, 'utf8'));
  }
  const explicitCert = source.certificate ? [readCertificate(source.certificate)] : undefined;
  const settings = {
    entityId: source.entityId ?? fromMetadata.entityId,
    ssoUrl: source.ssoUrl ?? fromMetadata.ssoUrl,
    certificates: explicitCert ?? fromMetadata.certificates ?? [],
  };
  if (!settings.entityId) throw new Error('The identity provider has no entity ID: set CUTLINE_SAML_IDP_ENTITY_ID or give its metadata.');
  if (!settings.ssoUrl) throw new Error('The identity provider has no HTTP-Redirect sign-on URL: set CUTLINE_SAML_IDP_SSO_URL or give its metadata.');
  if (settings.certificates.length === 0) throw new Error('The identity provider has no signing certificate: set CUTLINE_SAML_IDP_CERT or give its metadata.');
  return settings as IdentityProviderSettings;
}

/** Entity ID, redirect sign-on URL and signing certificates from an IdP metadata document. */
export function parseIdentityProviderMetadata(xml: string): Partial<IdentityProviderSettings> {
  const doc = new DOMParser().parseFromString(xml, 'text/xml');
  const entity = doc.getElementsByTagNameNS(MD, 'EntityDescriptor')[0];
  const idp = doc.getElementsByTagNameNS(MD, 'IDPSSODescriptor')[0];
  if (!entity || !idp) throw new Error('The identity provider metadata has no EntityDescriptor with an IDPSSODescriptor.');
  const sso = Array.from(idp.getElementsByTagNameNS(MD, 'SingleSignOnService')).find((e) => e.getAttribute('Binding') === REDIRECT);
  const certificates = Array.from(idp.getElementsByTagNameNS(MD, 'KeyDescriptor'))
    .filter((k) => !k.getAttribute('use') || k.getAttribute('use') === 'signing')
    .flatMap((k) => Array.from(k.getElementsByTagNameNS(DS, 'X509Certificate')))
    .map((c) => toPem((c.textContent ?? '').replace(/\s+/g, '')))
    .filter((pem) => pem.length > 60);
  return { entityId: entity.getAttribute('entityID') ?? undefined, ssoUrl: sso?.getAttribute('Location') ?? undefined, certificates };
}

/** PEM text as given, or the contents of the PEM file it names. */
function readCertificate(value: string): string {
  const text = value.includes('-----BEGIN') ? value : fs.readFileSync(value, 'utf8');
  if (!text.includes('-----BEGIN CERTIFICATE-----')) throw new Error('CUTLINE_SAML_IDP_CERT is neither a PEM certificate nor the path of one.');
  return text.replace(/\\n/g, '\n');
}

function toPem(base64: string): string {
  const lines = base64.match(/.{1,64}/g) ?? [];
  return `-----BEGIN CERTIFICATE-----\n${lines.join('\n')}\n-----END CERTIFICATE-----\n`;
}

import { randomUUID } from 'node:crypto';
import type { IdentityProviderSettings } from '../../auth/identity-provider';
import { escapeXml, loginResponseXml } from './login-response';
import { samlify } from './samlify';
import type { SigningKeys } from './signing-keys';

/** Who the local identity provider says is signing in. */
export interface LocalPerson {
  email: string;
  displayName: string;
  groups: readonly string[];
}

/** A sign-in request of a service provider, as read from the redirect binding. */
export interface PendingSignIn {
  requestId: string;
  /** The service provider's entity ID (the audience of the answer). */
  spEntityId: string;
  acsUrl: string;
  relayState: string;
}

/**
 * Ways to make the answer wrong on purpose, for tests of the service provider's checks.
 * The sign-in page never uses them.
 */
export interface AnswerDeviations {
  audience?: string;
  notBefore?: Date;
  notOnOrAfter?: Date;
  /** Leave both the response and the assertion unsigned. */
  unsigned?: boolean;
  assertionId?: string;
  issuer?: string;
}

/** A signed answer ready to be posted to the service provider. */
export interface SignInAnswer {
  acsUrl: string;
  SAMLResponse: string;
  RelayState: string;
  assertionId: string;
}

const POST = 'urn:oasis:names:tc:SAML:2.0:bindings:HTTP-POST';
const REDIRECT = 'urn:oasis:names:tc:SAML:2.0:bindings:HTTP-Redirect';
/** How long an answer stays valid: 5 minutes, common practice, no source. */
const ANSWER_LIFETIME_MS = 5 * 60_000;

/**
 * A SAML 2.0 identity provider for development, demos and tests. It trusts any service provider
 * whose assertion consumer service is on this machine (loopback), which is what makes it unfit for
 * anything but a stand-in. Answers are signed (response and assertion) with RSA-SHA256.
 */
export class LocalIdentityProvider {
  readonly entityId: string;
  readonly ssoUrl: string;
  private readonly entity: ReturnType<typeof samlify.IdentityProvider>;

  constructor(
    readonly baseUrl: string,
    private readonly keys: SigningKeys,
  ) {
    this.entityId = `${baseUrl}/metadata`;
    this.ssoUrl = `${baseUrl}/sso`;
    this.entity = samlify.IdentityProvider({ metadata: this.metadataXml(), privateKey: keys.privateKey });
  }

  /** What a service provider needs to trust this provider. */
  get settings(): IdentityProviderSettings {
    return { entityId: this.entityId, ssoUrl: this.ssoUrl, certificates: [this.keys.certificate] };
  }

  /** SAML metadata: entity ID, signing certificate, HTTP-Redirect sign-on (no single logout: Cutline signs out locally). */
  metadataXml(): string {
    const cert = this.keys.certificate.replace(/-----(BEGIN|END) CERTIFICATE-----|\s+/g, '');
    return (
      `<md:EntityDescriptor xmlns:md="urn:oasis:names:tc:SAML:2.0:metadata" xmlns:ds="http://www.w3.org/2000/09/xmldsig#" entityID="${escapeXml(this.entityId)}">` +
      `<md:IDPSSODescriptor WantAuthnRequestsSigned="false" protocolSupportEnumeration="urn:oasis:names:tc:SAML:2.0:protocol">` +
      `<md:KeyDescriptor use="signing"><ds:KeyInfo><ds:X509Data><ds:X509Certificate>${cert}</ds:X509Certificate></ds:X509Data></ds:KeyInfo></md:KeyDescriptor>` +
      `<md:NameIDFormat>urn:oasis:names:tc:SAML:1.1:nameid-format:emailAddress</md:NameIDFormat>` +
      `<md:SingleSignOnService Binding="${REDIRECT}" Location="${escapeXml(this.ssoUrl)}"/>` +
      `</md:IDPSSODescriptor></md:EntityDescriptor>`
    );
  }

  /**
   * Reads an AuthnRequest from the HTTP-Redirect binding's query.
   * @throws Error in plain words when the request is missing, unreadable or from a non-loopback service provider
   */
  readRequest(query: { SAMLRequest?: unknown; RelayState?: unknown }): PendingSignIn {
    if (typeof query.SAMLRequest !== 'string' || query.SAMLRequest === '') throw new Error('There is no SAMLRequest in the address.');
    let xml: string;
    try {
      xml = samlify.Utility.inflateString(query.SAMLRequest);
    } catch {
      throw new Error('The SAMLRequest could not be read (it should be deflated and base64-encoded).');
    }
    const { request, issuer } = samlify.Extractor.extract(xml, samlify.Extractor.loginRequestFields);
    const requestId = typeof request?.id === 'string' ? request.id : '';
    const acsUrl = typeof request?.assertionConsumerServiceUrl === 'string' ? request.assertionConsumerServiceUrl : '';
    if (!requestId || typeof issuer !== 'string' || !acsUrl) throw new Error('The sign-in request lacks an ID, an issuer or an AssertionConsumerServiceURL.');
    if (!isLoopback(acsUrl)) throw new Error('The local identity provider answers only service providers on this machine (127.0.0.1 or localhost).');
    return { requestId, spEntityId: issuer, acsUrl, relayState: typeof query.RelayState === 'string' ? query.RelayState : '' };
  }

  /** Builds and signs the answer to a pending request for one person. */
  async answer(pending: PendingSignIn, person: LocalPerson, deviations: AnswerDeviations = {}): Promise<SignInAnswer> {
    const now = new Date();
    const assertionId = deviations.assertionId ?? `_${randomUUID()}`;
    const xml = loginResponseXml({
      responseId: `_${randomUUID()}`,
      assertionId,
      issuer: deviations.issuer ?? this.entityId,
      destination: pending.acsUrl,
      inResponseTo: pending.requestId,
      audience: deviations.audience ?? pending.spEntityId,
      issueInstant: now,
      notBefore: deviations.notBefore ?? new Date(now.getTime() - 1000),
      notOnOrAfter: deviations.notOnOrAfter ?? new Date(now.getTime() + ANSWER_LIFETIME_MS),
      sessionIndex: `_${randomUUID()}`,
      nameId: person.email,
      attributes: { email: person.email, displayName: person.displayName, groups: person.groups },
    });
    const base = { acsUrl: pending.acsUrl, RelayState: pending.relayState, assertionId };
    if (deviations.unsigned) return { ...base, SAMLResponse: Buffer.from(xml, 'utf8').toString('base64') };
    const sp = samlify.ServiceProvider({
      entityID: pending.spEntityId,
      assertionConsumerService: [{ Binding: POST, Location: pending.acsUrl }],
      wantAssertionsSigned: true,
      wantMessageSigned: true,
    });
    const signed = await this.entity.createLoginResponse(sp, { extract: { request: { id: pending.requestId } } }, 'post', { email: person.email }, {
      customTagReplacement: () => ({ id: assertionId, context: xml }),
    });
    return { ...base, SAMLResponse: signed.context };
  }
}

function isLoopback(url: string): boolean {
  try {
    const { hostname, protocol } = new URL(url);
    return (protocol === 'http:' || protocol === 'https:') && ['127.0.0.1', 'localhost', '[::1]'].includes(hostname);
  } catch {
    return false;
  }
}

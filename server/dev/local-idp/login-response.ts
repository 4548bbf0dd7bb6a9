/**
 * The SAML 2.0 Response the local identity provider signs: one assertion with the person's
 * e-mail as NameID and `email`, `displayName` and `groups` attributes. Written out in full (not
 * samlify's template) so that tests can vary exactly the parts a real provider could get wrong.
 */
export interface LoginResponseFields {
  responseId: string;
  assertionId: string;
  issuer: string;
  /** Where the response is posted (the service provider's assertion consumer service). */
  destination: string;
  /** The service provider's request ID. */
  inResponseTo: string;
  audience: string;
  issueInstant: Date;
  notBefore: Date;
  notOnOrAfter: Date;
  sessionIndex: string;
  nameId: string;
  attributes: Record<string, string | readonly string[]>;
}

const PROTOCOL = 'urn:oasis:names:tc:SAML:2.0:protocol';
const ASSERTION = 'urn:oasis:names:tc:SAML:2.0:assertion';

export function loginResponseXml(f: LoginResponseFields): string {
  const t = (d: Date) => d.toISOString();
  const attributes = Object.entries(f.attributes)
    .map(([name, value]) => {
      const values = (typeof value === 'string' ? [value] : value).map((v) => `<saml:AttributeValue xsi:type="xs:string">${escapeXml(v)}</saml:AttributeValue>`);
      return `<saml:Attribute Name="${escapeXml(name)}" NameFormat="urn:oasis:names:tc:SAML:2.0:attrname-format:basic">${values.join('')}</saml:Attribute>`;
    })
    .join('');
  return (
    `<samlp:Response xmlns:samlp="${PROTOCOL}" xmlns:saml="${ASSERTION}" ID="${escapeXml(f.responseId)}" Version="2.0" IssueInstant="${t(f.issueInstant)}" ` +
    `Destination="${escapeXml(f.destination)}" InResponseTo="${escapeXml(f.inResponseTo)}">` +
    `<saml:Issuer>${escapeXml(f.issuer)}</saml:Issuer>` +
    `<samlp:Status><samlp:StatusCode Value="urn:oasis:names:tc:SAML:2.0:status:Success"/></samlp:Status>` +
    `<saml:Assertion xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xmlns:xs="http://www.w3.org/2001/XMLSchema" ID="${escapeXml(f.assertionId)}" Version="2.0" IssueInstant="${t(f.issueInstant)}">` +
    `<saml:Issuer>${escapeXml(f.issuer)}</saml:Issuer>` +
    `<saml:Subject><saml:NameID Format="urn:oasis:names:tc:SAML:1.1:nameid-format:emailAddress">${escapeXml(f.nameId)}</saml:NameID>` +
    `<saml:SubjectConfirmation Method="urn:oasis:names:tc:SAML:2.0:cm:bearer">` +
    `<saml:SubjectConfirmationData NotOnOrAfter="${t(f.notOnOrAfter)}" Recipient="${escapeXml(f.destination)}" InResponseTo="${escapeXml(f.inResponseTo)}"/>` +
    `</saml:SubjectConfirmation></saml:Subject>` +
    `<saml:Conditions NotBefore="${t(f.notBefore)}" NotOnOrAfter="${t(f.notOnOrAfter)}">` +
    `<saml:AudienceRestriction><saml:Audience>${escapeXml(f.audience)}</saml:Audience></saml:AudienceRestriction></saml:Conditions>` +
    `<saml:AuthnStatement AuthnInstant="${t(f.issueInstant)}" SessionIndex="${escapeXml(f.sessionIndex)}">` +
    `<saml:AuthnContext><saml:AuthnContextClassRef>urn:oasis:names:tc:SAML:2.0:ac:classes:PasswordProtectedTransport</saml:AuthnContextClassRef></saml:AuthnContext>` +
    `</saml:AuthnStatement>` +
    `<saml:AttributeStatement>${attributes}</saml:AttributeStatement>` +
    `</saml:Assertion></samlp:Response>`
  );
}

export function escapeXml(value: string): string {
  return value.replace(/[<>&"']/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', "'": '&apos;' })[c]!);
}

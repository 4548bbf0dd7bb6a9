import { DEMO_PEOPLE } from '@shared/demo/people';
import type { Role } from '@shared/schemas/roles';
import { escapeXml as escapeHtml } from './login-response';
import type { PendingSignIn } from './local-idp';

const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  analyst: 'Analyst',
  manager: 'Program manager',
  evaluator: 'Evaluator',
  director: 'Director',
};

/** Plain pages of the local identity provider; deliberately unlike Cutline so nobody mistakes one for the other. */
function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
body{font-family:system-ui,sans-serif;background:#f3f1ec;color:#222;margin:0}
main{max-width:42rem;margin:2.5rem auto;padding:0 1.25rem}
.band{background:#5b3f8c;color:#fff;padding:.6rem 1.25rem;font-size:.9rem}
h1{font-size:1.4rem;margin:.2rem 0 .8rem}
.people{display:grid;gap:.6rem;margin:1rem 0 2rem;padding:0;list-style:none}
.people button{width:100%;text-align:left;background:#fff;border:1px solid #c9c3b8;border-radius:6px;padding:.7rem .9rem;font:inherit;cursor:pointer}
.people button:hover,.people button:focus{border-color:#5b3f8c;outline:none;box-shadow:0 0 0 2px #d9cdef}
.who{font-weight:600}.what{color:#555;font-size:.9rem}
fieldset{border:1px solid #c9c3b8;border-radius:6px;background:#fff;padding:1rem}
label{display:block;margin:.5rem 0 .2rem;font-size:.9rem}
input[type=text],input[type=email]{width:100%;box-sizing:border-box;padding:.45rem;border:1px solid #aaa;border-radius:4px;font:inherit}
.submit{margin-top:1rem;background:#5b3f8c;color:#fff;border:0;border-radius:4px;padding:.5rem 1rem;font:inherit;cursor:pointer}
.note{color:#555;font-size:.85rem}.error{border-left:4px solid #a33;background:#fff;padding:.8rem 1rem}
</style></head><body><div class="band">Local identity provider · for development, demos and tests only · no passwords</div><main>${body}</main></body></html>`;
}

export function pickerPage(pending: PendingSignIn, rawRequest: string): string {
  const hidden = `<input type="hidden" name="SAMLRequest" value="${escapeHtml(rawRequest)}"><input type="hidden" name="RelayState" value="${escapeHtml(pending.relayState)}">`;
  const people = DEMO_PEOPLE.map(
    (p) => `<li><form method="post" action="/sso/answer">${hidden}<input type="hidden" name="person" value="${escapeHtml(p.email)}">
<button type="submit"><span class="who">${escapeHtml(p.displayName)}</span><br><span class="what">${ROLE_LABELS[p.role]}${p.scope === 'agency' ? ', agency-wide' : ', Winter Heating Credit'} · ${escapeHtml(p.email)}</span></button></form></li>`,
  ).join('');
  return page(
    'Sign in — local identity provider',
    `<h1>Who is signing in?</h1>
<p class="note">The application <strong>${escapeHtml(pending.spEntityId)}</strong> asks who you are. Pick a person of the invented demo scenario, or type anyone.</p>
<ul class="people" aria-label="Demo people">${people}</ul>
<form method="post" action="/sso/answer">${hidden}<fieldset><legend>Someone else</legend>
<label for="email">E-mail address</label><input id="email" name="email" type="email" required placeholder="name@agency.example">
<label for="displayName">Name (optional)</label><input id="displayName" name="displayName" type="text">
<label for="groups">Groups, separated by commas (optional)</label><input id="groups" name="groups" type="text" placeholder="hv-staff, hv-research">
<button class="submit" type="submit">Sign in as this person</button></fieldset></form>`,
  );
}

/** Posts the signed answer to the service provider, as the HTTP-POST binding prescribes. */
export function autoPostPage(acsUrl: string, fields: Record<string, string>): string {
  const inputs = Object.entries(fields)
    .map(([k, v]) => `<input type="hidden" name="${escapeHtml(k)}" value="${escapeHtml(v)}">`)
    .join('');
  return page(
    'Signing in…',
    `<form method="post" action="${escapeHtml(acsUrl)}">${inputs}<p>Returning to the application…</p><noscript><button class="submit" type="submit">Continue</button></noscript></form>
<script>document.forms[0].submit()</script>`,
  );
}

export function errorPage(message: string): string {
  return page('Sign-in request not understood', `<h1>This sign-in request cannot be answered</h1><p class="error">${escapeHtml(message)}</p>`);
}

export function homePage(entityId: string): string {
  return page(
    'Local identity provider',
    `<h1>Local identity provider</h1><p>Stands in for an agency's SAML identity provider on this machine. Start signing in from Cutline; this page is where you then pick who you are.</p>
<p class="note">Entity ID and metadata: <a href="/metadata">${escapeHtml(entityId)}</a></p>`,
  );
}

import path from 'node:path';
import express from 'express';
import { DEMO_PEOPLE } from '@shared/demo/people';
import { listen } from '../../http-server';
import { LocalIdentityProvider, type LocalPerson } from './local-idp';
import { autoPostPage, errorPage, homePage, pickerPage } from './pages';
import { ensureSigningKeys } from './signing-keys';

export interface RunningLocalIdp {
  idp: LocalIdentityProvider;
  url: string;
  close: () => Promise<void>;
}

/** The folder of the local identity provider's key pair under a var/ folder. */
export function localIdpKeysDir(varDir: string): string {
  return path.join(varDir, 'local-idp');
}

/**
 * Starts the local identity provider on 127.0.0.1:`port`: `/sso` (HTTP-Redirect) shows who may
 * sign in, `/sso/answer` signs and posts the answer, `/metadata` describes it.
 */
export async function startLocalIdp(options: { port: number; varDir: string }): Promise<RunningLocalIdp> {
  const url = `http://127.0.0.1:${options.port}`;
  const idp = new LocalIdentityProvider(url, ensureSigningKeys(localIdpKeysDir(options.varDir)));
  const app = express();
  app.disable('x-powered-by');
  app.get('/', (_req, res) => void res.type('html').send(homePage(idp.entityId)));
  app.get('/metadata', (_req, res) => void res.type('application/samlmetadata+xml').send(idp.metadataXml()));
  app.get('/sso', (req, res) => {
    try {
      const pending = idp.readRequest(req.query as Record<string, unknown>);
      res.type('html').send(pickerPage(pending, String(req.query.SAMLRequest)));
    } catch (err) {
      res.status(400).type('html').send(errorPage((err as Error).message));
    }
  });
  app.post('/sso/answer', express.urlencoded({ extended: false, limit: '256kb' }), async (req, res) => {
    const body = req.body as Record<string, string | undefined>;
    try {
      const pending = idp.readRequest(body);
      const person = personFromForm(body);
      const answer = await idp.answer(pending, person);
      res.type('html').send(autoPostPage(answer.acsUrl, { SAMLResponse: answer.SAMLResponse, RelayState: answer.RelayState }));
    } catch (err) {
      res.status(400).type('html').send(errorPage((err as Error).message));
    }
  });
  const http = await listen(app, options.port);
  return { idp, url, close: http.close };
}

function personFromForm(body: Record<string, string | undefined>): LocalPerson {
  const demo = DEMO_PEOPLE.find((p) => p.email === body.person);
  if (demo) return { email: demo.email, displayName: demo.displayName, groups: demo.groups };
  const email = (body.email ?? '').trim().toLowerCase();
  if (!/^[^\s@]+@[^\s@]+$/.test(email)) throw new Error('Type an e-mail address such as name@agency.example.');
  const groups = (body.groups ?? '')
    .split(',')
    .map((g) => g.trim())
    .filter(Boolean);
  return { email, displayName: (body.displayName ?? '').trim() || email, groups };
}

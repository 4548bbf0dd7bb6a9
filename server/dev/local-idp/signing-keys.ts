import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ensureDebianPackages, findExecutable } from '../../setup/debian-packages';

export interface SigningKeys {
  /** RSA-2048 private key, PEM. */
  privateKey: string;
  /** Self-signed X.509 certificate of that key, PEM. */
  certificate: string;
}

/**
 * The local identity provider's key pair and self-signed certificate, generated once with openssl
 * into `dir` (under `var/`, never committed). Written to a scratch folder and renamed into place,
 * so that several processes starting at once never see half a key.
 */
export function ensureSigningKeys(dir: string, commonName = 'Cutline local identity provider'): SigningKeys {
  const keyFile = path.join(dir, 'signing-key.pem');
  const certFile = path.join(dir, 'signing-cert.pem');
  if (!fs.existsSync(certFile)) {
    if (!findExecutable('openssl')) ensureDebianPackages(['openssl'], 'the local identity provider’s signing key');
    fs.mkdirSync(path.dirname(dir), { recursive: true });
    const scratch = fs.mkdtempSync(`${dir}.tmp-`);
    const result = spawnSync(
      'openssl',
      ['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-sha256', '-days', '3650', '-subj', `/CN=${commonName}`,
        '-keyout', path.join(scratch, 'signing-key.pem'), '-out', path.join(scratch, 'signing-cert.pem')],
      { encoding: 'utf8' },
    );
    if (result.status !== 0) throw new Error(`openssl could not create the local identity provider's key: ${result.stderr.trim()}`);
    fs.chmodSync(path.join(scratch, 'signing-key.pem'), 0o600);
    try {
      fs.renameSync(scratch, dir);
    } catch {
      // Another process won the race; its keys are as good as ours.
      fs.rmSync(scratch, { recursive: true, force: true });
    }
  }
  return { privateKey: fs.readFileSync(keyFile, 'utf8'), certificate: fs.readFileSync(certFile, 'utf8') };
}

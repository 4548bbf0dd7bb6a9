import { LocalIdentityProvider } from '@server/dev/local-idp/local-idp';
import { localIdpKeysDir, startLocalIdp, type RunningLocalIdp } from '@server/dev/local-idp/server';
import { ensureSigningKeys } from '@server/dev/local-idp/signing-keys';
import { TEST_VAR_DIR, testPorts } from './test-env';

/** Base URL of the tests' local identity provider (127.0.0.1, port base+12). */
export function testIdpUrl(): string {
  return `http://127.0.0.1:${testPorts().idp}`;
}

let shared: LocalIdentityProvider | undefined;

/**
 * The tests' local identity provider, in process, without a listening port: API tests hand it the
 * sign-in request from the app's redirect and post its signed answer back (`tests/support/sign-in.ts`).
 * Its key pair lives in var/test/local-idp (made by `npm test`, or here on first use).
 */
export function testIdentityProvider(): LocalIdentityProvider {
  shared ??= new LocalIdentityProvider(testIdpUrl(), ensureSigningKeys(localIdpKeysDir(TEST_VAR_DIR)));
  return shared;
}

/**
 * An identity provider with its own, different key pair under the same entity ID: what an
 * impostor could sign. The app must refuse its answers.
 */
export function impostorIdentityProvider(): LocalIdentityProvider {
  return new LocalIdentityProvider(testIdpUrl(), ensureSigningKeys(`${localIdpKeysDir(TEST_VAR_DIR)}-impostor`, 'Impostor'));
}

/**
 * The same provider listening on 127.0.0.1:base+12, for browser tests (which must be driven
 * through its sign-in page). Browser test files run one at a time, so the port is free; close it in `afterAll`.
 */
export function startTestIdp(): Promise<RunningLocalIdp> {
  return startLocalIdp({ port: testPorts().idp, varDir: TEST_VAR_DIR });
}

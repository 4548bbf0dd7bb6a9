import * as namespace from 'samlify';

/**
 * samlify is CommonJS; under Node's ESM loader only some of its exports are visible as named
 * imports (Utility and SamlLib are not), so everything is taken from the module object.
 */
export const samlify: typeof namespace = ((namespace as unknown as { default?: typeof namespace }).default ?? namespace);

// Only the local identity provider uses samlify, and it validates nothing it receives with
// samlify's parsers; the service-provider side (node-saml) does the real checking.
samlify.setSchemaValidator({ validate: () => Promise.resolve('skipped') });

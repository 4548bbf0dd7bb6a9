import type { DesignSettings } from '@shared/schemas/design';

/** Settings in a fixed order, so comparisons and signatures do not depend on key order. */
export const SETTING_KEYS: Array<keyof DesignSettings> = [
  'outcomes',
  'takeUp',
  'covariates',
  'kernel',
  'order',
  'bandwidthRule',
  'bandwidthValue',
  'variance',
  'cluster',
  'level',
  'donutRadius',
];

/** Settings whose values differ between two versions, in `SETTING_KEYS` order. */
export function changedSettings(from: DesignSettings, to: DesignSettings): Array<keyof DesignSettings> {
  return SETTING_KEYS.filter((k) => canonicalJson(from[k]) !== canonicalJson(to[k]));
}

/** JSON with object keys sorted, for equality and hashing. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b)))
      : v,
  );
}

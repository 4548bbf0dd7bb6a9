import { z } from 'zod';
import { VariableKeySchema } from './program';

/** Kernels a design may use (METHODS §1a). */
export const DESIGN_KERNELS = ['triangular', 'epanechnikov', 'uniform'] as const;
export type DesignKernel = (typeof DESIGN_KERNELS)[number];

/** Data-driven bandwidth rules (METHODS §3), or `fixed` with `bandwidthValue` in score units. */
export const DESIGN_BANDWIDTH_RULES = ['mse', 'mse-per-side', 'coverage', 'ik', 'fixed'] as const;
export type DesignBandwidthRule = (typeof DESIGN_BANDWIDTH_RULES)[number];

/** Variance estimators (METHODS §2). With a cluster the sandwich is cluster-robust (hc0 or hc1 only). */
export const DESIGN_VARIANCES = ['nearest-neighbour', 'hc0', 'hc1', 'hc2', 'hc3'] as const;
export type DesignVariance = (typeof DESIGN_VARIANCES)[number];

/** What counts as taking part: the extract's mapped take-up column (0/1). */
export const TAKE_UP_SOURCES = ['take-up-column'] as const;

/** Pooled windows: the last N cohorts. */
export const WINDOW_SIZES = [3, 6, 12] as const;
export type WindowSize = (typeof WINDOW_SIZES)[number];

/**
 * The analysis settings of one design version. Every result records the version it used, so
 * changing any of these makes a new version (and, once the design is locked, a deviation).
 */
export const DesignSettingsSchema = z
  .object({
    /** Outcomes to evaluate, by key; the first is the primary outcome. */
    outcomes: z.array(VariableKeySchema).min(1, 'Choose at least one outcome.').max(8),
    takeUp: z.object({
      source: z.enum(TAKE_UP_SOURCES),
      /** The agency's own words for what counts as taking part (shown in the annex). */
      description: z.string().trim().min(1, 'Say what counts as taking part.').max(500),
    }),
    /** Pre-determined covariates whose balance at the cutoff is checked. */
    covariates: z.array(VariableKeySchema).max(8),
    kernel: z.enum(DESIGN_KERNELS),
    /** Local polynomial order p. */
    order: z.union([z.literal(1), z.literal(2)]),
    bandwidthRule: z.enum(DESIGN_BANDWIDTH_RULES),
    /** Score units; only with `bandwidthRule: 'fixed'`. */
    bandwidthValue: z.number().positive().finite().nullable(),
    variance: z.enum(DESIGN_VARIANCES),
    /** Cluster the variance by the extract's mapped cluster column (e.g. office). */
    cluster: z.enum(['none', 'cluster-column']),
    /** Confidence level of every interval, e.g. 0.95. */
    level: z.number().min(0.5).max(0.999),
    /** Scores within this distance of the cutoff (score units) are left out; 0 keeps everyone. */
    donutRadius: z.number().min(0).finite(),
  })
  .superRefine((s, ctx) => {
    if (s.bandwidthRule === 'fixed' && s.bandwidthValue === null) {
      ctx.addIssue({ code: 'custom', path: ['bandwidthValue'], message: 'A fixed bandwidth needs a value in score units.' });
    }
    if (s.bandwidthRule !== 'fixed' && s.bandwidthValue !== null) {
      ctx.addIssue({ code: 'custom', path: ['bandwidthValue'], message: 'Leave the bandwidth value empty when a rule chooses it.' });
    }
    if (s.bandwidthRule === 'ik' && s.order !== 1) {
      ctx.addIssue({ code: 'custom', path: ['bandwidthRule'], message: 'The Imbens–Kalyanaraman rule is for order 1 only.' });
    }
    if (s.cluster === 'cluster-column' && s.variance !== 'hc0' && s.variance !== 'hc1') {
      ctx.addIssue({ code: 'custom', path: ['variance'], message: 'With clusters, choose HC0 or HC1 (cluster-robust).' });
    }
    if (new Set(s.outcomes).size !== s.outcomes.length) {
      ctx.addIssue({ code: 'custom', path: ['outcomes'], message: 'Each outcome may be listed once.' });
    }
    if (new Set(s.covariates).size !== s.covariates.length) {
      ctx.addIssue({ code: 'custom', path: ['covariates'], message: 'Each covariate may be listed once.' });
    }
  });
export type DesignSettings = z.infer<typeof DesignSettingsSchema>;

/** Settings a new design starts from (common practice: local linear, triangular kernel, MSE bandwidth, no source). */
export function defaultDesignSettings(outcomes: string[], covariates: string[]): DesignSettings {
  return {
    outcomes,
    takeUp: { source: 'take-up-column', description: 'Received the program (take-up column of the extract).' },
    covariates,
    kernel: 'triangular',
    order: 1,
    bandwidthRule: 'mse',
    bandwidthValue: null,
    // HC3, the engine's own default: in the Lee design check (tests/reference/lee-design.test.ts) its robust
    // intervals cover 0.930 against 0.914 for nearest-neighbour residuals.
    variance: 'hc3',
    cluster: 'none',
    level: 0.95,
    donutRadius: 0,
  };
}

export const DesignNameSchema = z.string().trim().min(1, 'Give the design a name.').max(200);

/** `POST /api/programs/:programId/designs` */
export const DesignCreateSchema = z.object({
  name: DesignNameSchema,
  settings: DesignSettingsSchema,
  /** Make this the design that scheduled recomputes and dashboards use. */
  primary: z.boolean().default(false),
});
export type DesignCreateInput = z.infer<typeof DesignCreateSchema>;

/**
 * `POST /api/programs/:programId/designs/:designId/versions`: an edit makes a new version. Once the
 * design is locked, `reason` is required and the change is recorded as a deviation.
 */
export const DesignVersionCreateSchema = z.object({
  settings: DesignSettingsSchema,
  /** Why the settings changed; required after the design is locked. */
  reason: z.string().trim().max(2000).optional(),
});
export type DesignVersionCreateInput = z.infer<typeof DesignVersionCreateSchema>;

/** `POST /api/programs/:programId/designs/:designId/lock`: pre-register the current version. */
export const DesignLockSchema = z.object({
  note: z.string().trim().max(2000).optional(),
});
export type DesignLockInput = z.infer<typeof DesignLockSchema>;

/** `PATCH /api/programs/:programId/designs/:designId`: name and primary flag (not analysis settings). */
export const DesignUpdateSchema = z.object({
  name: DesignNameSchema.optional(),
  primary: z.literal(true).optional(),
});
export type DesignUpdateInput = z.infer<typeof DesignUpdateSchema>;

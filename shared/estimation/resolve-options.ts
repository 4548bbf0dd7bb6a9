import { KERNELS } from './kernels';
import type { BandwidthRule, DiscontinuityData, DiscontinuityOptions, ResolvedOptions, VarianceKind } from './types';

export const BANDWIDTH_RULES: readonly BandwidthRule[] = ['mse', 'mse-per-side', 'coverage', 'ik'];
export const VARIANCE_KINDS: readonly VarianceKind[] = ['hc0', 'hc1', 'hc2', 'hc3', 'nearest-neighbour'];
export const DEFAULT_NEIGHBOURS = 3;
export const DEFAULT_LEVEL = 0.95;

/**
 * Checks the columns' types and lengths (values are checked in the engine's first pass,
 * `prepareData`). @throws TypeError for a wrong type, RangeError for a wrong length; messages start with `fn`.
 */
export function validateData(fn: string, data: DiscontinuityData): void {
  if (typeof data !== 'object' || data === null) throw new TypeError(`${fn}: data must be an object of typed arrays`);
  const { score, outcome, takeUp, cluster } = data;
  if (!(score instanceof Float64Array)) throw new TypeError(`${fn}: data.score must be a Float64Array`);
  if (!(outcome instanceof Float64Array)) throw new TypeError(`${fn}: data.outcome must be a Float64Array`);
  if (takeUp !== undefined && !(takeUp instanceof Float64Array)) throw new TypeError(`${fn}: data.takeUp must be a Float64Array`);
  if (cluster !== undefined && !(cluster instanceof Int32Array)) throw new TypeError(`${fn}: data.cluster must be an Int32Array`);
  const n = score.length;
  if (n === 0) throw new RangeError(`${fn}: data has no observations`);
  for (const [name, column] of [['outcome', outcome], ['takeUp', takeUp], ['cluster', cluster]] as const) {
    if (column && column.length !== n) throw new RangeError(`${fn}: data.${name} has ${column.length} entries but data.score has ${n}`);
  }
}

/**
 * Applies the defaults and checks every option.
 * @throws TypeError / RangeError naming `fn` and the option.
 */
export function resolveOptions(fn: string, options: DiscontinuityOptions, clustered: boolean): ResolvedOptions {
  if (typeof options !== 'object' || options === null) throw new TypeError(`${fn}: options must be an object`);
  const { cutoff, eligibleSide } = options;
  if (typeof cutoff !== 'number' || !Number.isFinite(cutoff)) throw new RangeError(`${fn}: options.cutoff must be a finite number`);
  if (eligibleSide !== 'at-or-above' && eligibleSide !== 'at-or-below') {
    throw new RangeError(`${fn}: options.eligibleSide must be "at-or-above" or "at-or-below"`);
  }
  const kernel = options.kernel ?? 'triangular';
  if (!KERNELS.includes(kernel)) throw new RangeError(`${fn}: options.kernel must be one of ${KERNELS.join(', ')}`);
  const order = options.order ?? 1;
  if (order !== 0 && order !== 1 && order !== 2) throw new RangeError(`${fn}: options.order must be 0, 1 or 2`);
  const bandwidth = options.bandwidth ?? { rule: 'mse' as const };
  if (typeof bandwidth === 'number') {
    if (!(bandwidth > 0) || !Number.isFinite(bandwidth)) throw new RangeError(`${fn}: options.bandwidth must be a positive number`);
  } else if (typeof bandwidth !== 'object' || bandwidth === null || !BANDWIDTH_RULES.includes(bandwidth.rule)) {
    throw new RangeError(`${fn}: options.bandwidth must be a positive number or { rule: ${BANDWIDTH_RULES.join(' | ')} }`);
  } else if (bandwidth.rule === 'ik' && order !== 1) {
    throw new RangeError(`${fn}: the Imbens–Kalyanaraman rule is defined for order 1 only`);
  }
  const biasBandwidth = options.biasBandwidth ?? null;
  if (biasBandwidth !== null && (!(biasBandwidth > 0) || !Number.isFinite(biasBandwidth))) {
    throw new RangeError(`${fn}: options.biasBandwidth must be a positive number`);
  }
  const variance = options.variance ?? (clustered ? 'hc1' : 'hc3');
  if (!VARIANCE_KINDS.includes(variance)) throw new RangeError(`${fn}: options.variance must be one of ${VARIANCE_KINDS.join(', ')}`);
  if (clustered && variance !== 'hc0' && variance !== 'hc1') {
    // Nearest-neighbour residuals assume independent observations (Noack, Olma & Rothe, METHODS §2c);
    // leverage corrections have no agreed cluster form here.
    throw new RangeError(`${fn}: with a cluster column the variance must be hc0 or hc1, not ${variance}`);
  }
  const neighbours = options.neighbours ?? DEFAULT_NEIGHBOURS;
  if (!Number.isInteger(neighbours) || neighbours < 1) throw new RangeError(`${fn}: options.neighbours must be a positive integer`);
  const level = options.level ?? DEFAULT_LEVEL;
  if (typeof level !== 'number' || !(level > 0 && level < 1)) throw new RangeError(`${fn}: options.level must be between 0 and 1`);
  return {
    cutoff,
    eligibleSide,
    kernel,
    order,
    bandwidth: typeof bandwidth === 'number' ? bandwidth : { rule: bandwidth.rule },
    biasBandwidth,
    variance,
    neighbours,
    level,
    clustered,
  };
}

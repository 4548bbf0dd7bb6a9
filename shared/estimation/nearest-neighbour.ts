import type { OrientedData } from './oriented-data';

/** Distances closer than this relative gap count as tied (scores on a grid such as 0.1 points). */
const TIE_RELATIVE = 1e-9;

/**
 * Nearest-neighbour residuals, one array per column: for observation i on a side,
 *
 *   eᵢ = √(Jᵢ/(Jᵢ+1)) · (yᵢ − mean of y over its Jᵢ nearest scores on the same side),
 *
 * so eᵢ² is the nearest-neighbour estimate σ̂²(Xᵢ) and eᵢʸeᵢᵈ the covariance estimate σ̂_YD(Xᵢ) of
 * METHODS §2c (Calonico, Cattaneo & Titiunik 2014, after Abadie & Imbens; J = 3 by default, from
 * memory). The factor makes σ̂² unbiased when σ²(x) is locally constant:
 * Var(yᵢ − ȳ_J) = σ²(1 + 1/J) [derived]. Neighbours are searched among all observations on the same
 * side (never across the cutoff); every observation at the J-th distance is included, so Jᵢ ≥ J
 * with ties, and observations with the same score are each other's nearest neighbours.
 *
 * Works per group of equal scores: members share one neighbour set apart from themselves, so
 * heavily tied scores cost O(group size), not its square.
 *
 * Needs every observation, sorted by score (`prepareData`'s sorted layout).
 */
export function nearestNeighbourResiduals(data: OrientedData, neighbours: number): Float64Array[] {
  if (data.layout !== 'sorted') throw new RangeError('nearestNeighbourResiduals: needs every observation sorted by score');
  const { t, columns, n } = data;
  const cols = columns.length;
  const out = columns.map(() => new Float64Array(n));
  if (n === 0) return out;
  // Groups of equal t in sorted order.
  const groupStart = new Int32Array(n + 1);
  const groupValue = new Float64Array(n);
  let groups = 0;
  for (let pos = 0; pos < n; pos++) {
    const v = t[pos]!;
    if (pos === 0 || v !== groupValue[groups - 1]) {
      groupStart[groups] = pos;
      groupValue[groups] = v;
      groups++;
    }
  }
  groupStart[groups] = n;
  const groupSum = new Float64Array(groups * cols);
  for (let g = 0; g < groups; g++) {
    for (let i = groupStart[g]!; i < groupStart[g + 1]!; i++) {
      for (let c = 0; c < cols; c++) groupSum[g * cols + c]! += columns[c]![i]!;
    }
  }
  // First eligible group: groups never straddle the cutoff because t < 0 and t ≥ 0 differ.
  let split = 0;
  while (split < groups && groupStart[split]! < data.split) split++;
  const sums = new Float64Array(cols);
  const runSide = (first: number, end: number) => {
    for (let g = first; g < end; g++) {
      const v = groupValue[g]!;
      let count = groupStart[g + 1]! - groupStart[g]!;
      for (let c = 0; c < cols; c++) sums[c] = groupSum[g * cols + c]!;
      let left = g - 1;
      let right = g + 1;
      while (count - 1 < neighbours) {
        const dl = left >= first ? v - groupValue[left]! : Infinity;
        const dr = right < end ? groupValue[right]! - v : Infinity;
        if (dl === Infinity && dr === Infinity) break;
        const tie = Math.abs(dl - dr) <= TIE_RELATIVE * Math.min(dl, dr);
        if (tie || dl < dr) {
          count += groupStart[left + 1]! - groupStart[left]!;
          for (let c = 0; c < cols; c++) sums[c]! += groupSum[left * cols + c]!;
          left--;
        }
        if (tie || dr < dl) {
          count += groupStart[right + 1]! - groupStart[right]!;
          for (let c = 0; c < cols; c++) sums[c]! += groupSum[right * cols + c]!;
          right++;
        }
      }
      const others = count - 1;
      if (others === 0) continue; // a lone observation: no estimate (the fit will refuse the side anyway)
      const factor = Math.sqrt(others / (others + 1));
      for (let i = groupStart[g]!; i < groupStart[g + 1]!; i++) {
        for (let c = 0; c < cols; c++) {
          const y = columns[c]![i]!;
          out[c]![i] = factor * (y - (sums[c]! - y) / others);
        }
      }
    }
  };
  runSide(0, split);
  runSide(split, groups);
  return out;
}

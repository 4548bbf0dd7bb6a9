import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { nearestNeighbourResiduals } from './nearest-neighbour';
import { prepareData } from './oriented-data';

const sorted = (score: number[], y: number[]) =>
  prepareData('test', { score: Float64Array.from(score), columns: [Float64Array.from(y)], cluster: null }, 0, 'at-or-above', null, null);

describe('nearestNeighbourResiduals', () => {
  // METHODS §2e [derived], by hand: equally spaced scores, y = ±1 alternating, J = 1. An interior
  // point has two neighbours at the same distance (ties at the J-th distance are included), both of
  // the other sign: e = √(2/3)·(±1 ∓ 1) so e² = (2/3)·4. An end point has one: e² = (1/2)·4.
  it('reproduces the hand-computed alternating example', () => {
    const score = [1, 2, 3, 4, 5, 6];
    const y = [1, -1, 1, -1, 1, -1];
    const [e] = nearestNeighbourResiduals(sorted(score, y), 1);
    const squares = Array.from(e!, (v) => v * v);
    expect(squares[0]).toBeCloseTo(2, 14);
    expect(squares[5]).toBeCloseTo(2, 14);
    for (const v of squares.slice(1, 5)) expect(v).toBeCloseTo(8 / 3, 14);
  });

  it('never crosses the cutoff and treats equal scores as nearest', () => {
    // Scores −2, −1 | 0, 0, 0, 5: the three at 0 are each other's neighbours (J = 2).
    const [e] = nearestNeighbourResiduals(sorted([-2, -1, 0, 0, 0, 5], [10, 20, 1, 2, 3, 100]), 2);
    // Sorted order is the input order here. Point 0 (y = 1): neighbours y = 2, 3 → mean 2.5.
    expect(e![2]).toBeCloseTo(Math.sqrt(2 / 3) * (1 - 2.5), 14);
    // Score −2 has one neighbour on its side only (y = 20): J = 1.
    expect(e![0]).toBeCloseTo(Math.sqrt(1 / 2) * (10 - 20), 14);
  });

  // J/(J+1) makes E[e²] = σ² when σ² is locally constant [derived]: Var(yᵢ − ȳ_J) = σ²(1 + 1/J).
  it('is unbiased for a homoskedastic error', () => {
    const rng = createRng(21);
    const n = 200_000;
    const score: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < n; i++) {
      const x = rng.uniform() * 2 - 1;
      score.push(x);
      y.push(Math.sin(3 * x) + 0.5 * rng.normal());
    }
    const data = sorted(score, y);
    const [e] = nearestNeighbourResiduals(data, 3);
    let mean = 0;
    for (const v of e!) mean += v * v;
    mean /= n;
    // σ² = 0.25; Monte Carlo SE of the mean ≈ 0.25·√2/√n ≈ 0.0008 (plus a small curvature bias).
    expect(Math.abs(mean - 0.25)).toBeLessThan(0.004);
  });
});

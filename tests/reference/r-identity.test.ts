import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { estimateDiscontinuity, normalCdf, normalQuantile, type DiscontinuityOptions, type VarianceKind } from '@shared/estimation';
import { createRng } from '@shared/random/rng';
import { plainFuzzyDesign } from '@tests/support/rd-designs';
import { runRScript, writeCsv } from '@tests/support/r-script';

/**
 * Check 1 of issue 3: identity with general-purpose 2SLS and weighted least squares, run live in R
 * (AER::ivreg, sandwich::vcovHC / vcovCL; R, AER and sandwich from Debian). Nothing is stored: R
 * fits the same rows from a temporary CSV each run. The fuzzy RD estimate is just-identified
 * weighted 2SLS of y on (1, D, x, Z·x) with instruments (1, Z, x, Z·x) inside h (Imbens & Lemieux
 * 2008 §4.3; METHODS §1b); the sharp jump is the weighted-lm coefficient on Z in y ~ Z + x + Z·x.
 * With b = h the robust bias-corrected result is the order-2 fit at h (Frisch–Waugh, METHODS §3c),
 * so R's quadratic lm checks the robust variance too.
 */
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-ref-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const data = plainFuzzyDesign(createRng(20240601), 6000);
const file = path.join(dir, 'fuzzy.csv');
writeCsv(file, { score: data.score, y: data.outcome, d: data.takeUp, office: data.cluster });
const H = 14;
const CUTOFF = 60;

const R_SCRIPT = String.raw`
suppressMessages({ library(AER); library(sandwich) })
out <- function(key, value) cat(sprintf("%s %.17g\n", key, value))
raw <- read.csv("${file}")
kernel <- function(u, k) ifelse(abs(u) <= 1, switch(k, triangular = 1 - abs(u), epanechnikov = 0.75 * (1 - u^2), uniform = 0.5), 0)
for (side in c("above", "below")) for (k in c("triangular", "epanechnikov", "uniform")) {
  dat <- raw
  dat$x <- dat$score - ${CUTOFF}
  dat$z <- if (side == "above") as.numeric(dat$x >= 0) else as.numeric(dat$x <= 0)
  dat$w <- kernel(dat$x / ${H}, k)
  s <- dat[dat$w > 0, ]
  s$zx <- s$z * s$x; s$x2 <- s$x^2; s$zx2 <- s$z * s$x2
  tag <- paste(side, k, sep = ".")
  iv <- ivreg(y ~ d + x + zx | z + x + zx, weights = w, data = s)
  out(paste0(tag, ".fuzzy.estimate"), coef(iv)[["d"]])
  out(paste0(tag, ".fuzzy.hc0"), sqrt(vcovHC(iv, type = "HC0")["d", "d"]))
  out(paste0(tag, ".fuzzy.cl0"), sqrt(vcovCL(iv, cluster = ~office, type = "HC0")["d", "d"]))
  out(paste0(tag, ".fuzzy.cl1"), sqrt(vcovCL(iv, cluster = ~office, type = "HC1")["d", "d"]))
  fs <- lm(d ~ z + x + zx, weights = w, data = s)
  out(paste0(tag, ".first.estimate"), coef(fs)[["z"]])
  out(paste0(tag, ".first.hc0"), sqrt(vcovHC(fs, type = "HC0")["z", "z"]))
  sh <- lm(y ~ z + x + zx, weights = w, data = s)
  out(paste0(tag, ".sharp.estimate"), coef(sh)[["z"]])
  for (type in c("HC0", "HC2", "HC3")) out(paste0(tag, ".sharp.", tolower(type)), sqrt(vcovHC(sh, type = type)["z", "z"]))
  out(paste0(tag, ".sharp.cl0"), sqrt(vcovCL(sh, cluster = ~office, type = "HC0")["z", "z"]))
  out(paste0(tag, ".sharp.cl1"), sqrt(vcovCL(sh, cluster = ~office, type = "HC1")["z", "z"]))
  q <- lm(y ~ z + x + zx + x2 + zx2, weights = w, data = s)
  out(paste0(tag, ".quadratic.estimate"), coef(q)[["z"]])
  out(paste0(tag, ".quadratic.hc0"), sqrt(vcovHC(q, type = "HC0")["z", "z"]))
  out(paste0(tag, ".quadratic.hc3"), sqrt(vcovHC(q, type = "HC3")["z", "z"]))
  ivq <- ivreg(y ~ d + x + zx + x2 + zx2 | z + x + zx + x2 + zx2, weights = w, data = s)
  out(paste0(tag, ".fuzzyquadratic.estimate"), coef(ivq)[["d"]])
  out(paste0(tag, ".fuzzyquadratic.hc0"), sqrt(vcovHC(ivq, type = "HC0")["d", "d"]))
}
for (p in c(0.005, 0.025, 0.1, 0.5, 0.9, 0.975)) out(paste0("qnorm.", p), qnorm(p))
for (z in c(-6, -3.2, -1.96, 0.4, 2.5)) out(paste0("pnorm.", z), pnorm(z))
`;

let r = new Map<string, number>();
beforeAll(() => {
  r = runRScript(R_SCRIPT);
});
const get = (key: string) => {
  const v = r.get(key);
  if (v === undefined) throw new Error(`R did not print ${key}`);
  return v;
};
/** Largest relative differences seen, printed at the end (estimates and standard errors). */
const largest = { estimate: 0, se: 0 };
const relative = (a: number, b: number, kind: 'estimate' | 'se' = 'se') => {
  const r = Math.abs(a - b) / Math.abs(b);
  largest[kind] = Math.max(largest[kind], r);
  return r;
};
afterAll(() => console.log(`largest relative difference from R: estimates ${largest.estimate.toExponential(1)}, standard errors ${largest.se.toExponential(1)}`));

describe('identity with R (AER::ivreg, lm, sandwich), run live', () => {
  const sides = [
    ['above', 'at-or-above'],
    ['below', 'at-or-below'],
  ] as const;
  const kernels = ['triangular', 'epanechnikov', 'uniform'] as const;
  const sharp = { score: data.score, outcome: data.outcome };
  const fuzzy = { ...sharp, takeUp: data.takeUp };
  const clustered = { ...fuzzy, cluster: data.cluster };

  for (const [tag, eligibleSide] of sides) {
    for (const kernel of kernels) {
      const key = `${tag}.${kernel}`;
      const options = (variance: VarianceKind, order: 1 | 2 = 1): DiscontinuityOptions => ({ cutoff: CUTOFF, eligibleSide, kernel, order, bandwidth: H, variance });

      it(`${key}: fuzzy estimate and HC0 SE equal ivreg + vcovHC(HC0); first stage equals lm`, () => {
        const e = estimateDiscontinuity(fuzzy, options('hc0'));
        expect(relative(e.effect.estimate, get(`${key}.fuzzy.estimate`), 'estimate')).toBeLessThan(1e-8);
        expect(relative(e.effect.se, get(`${key}.fuzzy.hc0`))).toBeLessThan(1e-6);
        expect(relative(e.firstStage!.jump, get(`${key}.first.estimate`), 'estimate')).toBeLessThan(1e-8);
        expect(relative(e.firstStage!.se, get(`${key}.first.hc0`))).toBeLessThan(1e-6);
      });

      it(`${key}: sharp estimate and HC0/HC2/HC3 SEs equal weighted lm + vcovHC`, () => {
        for (const variance of ['hc0', 'hc2', 'hc3'] as const) {
          const e = estimateDiscontinuity(sharp, options(variance));
          expect(relative(e.effect.estimate, get(`${key}.sharp.estimate`), 'estimate')).toBeLessThan(1e-8);
          expect(relative(e.effect.se, get(`${key}.sharp.${variance}`))).toBeLessThan(1e-6);
        }
      });

      it(`${key}: cluster-robust SEs equal vcovCL (HC0 and HC1), clusters straddling the cutoff`, () => {
        for (const [variance, suffix] of [['hc0', 'cl0'], ['hc1', 'cl1']] as const) {
          const s = estimateDiscontinuity({ ...sharp, cluster: data.cluster }, options(variance));
          expect(relative(s.effect.se, get(`${key}.sharp.${suffix}`))).toBeLessThan(1e-6);
          const f = estimateDiscontinuity(clustered, options(variance));
          expect(relative(f.effect.se, get(`${key}.fuzzy.${suffix}`))).toBeLessThan(1e-6);
        }
      });

      it(`${key}: with b = h the robust result equals R's order-2 fit (estimate, HC0 and HC3)`, () => {
        for (const variance of ['hc0', 'hc3'] as const) {
          const e = estimateDiscontinuity(sharp, options(variance));
          expect(relative(e.effect.robust.estimate, get(`${key}.quadratic.estimate`), 'estimate')).toBeLessThan(1e-8);
          expect(relative(e.effect.robust.se, get(`${key}.quadratic.${variance}`))).toBeLessThan(1e-6);
        }
        const f = estimateDiscontinuity(fuzzy, options('hc0'));
        expect(relative(f.effect.robust.estimate, get(`${key}.fuzzyquadratic.estimate`), 'estimate')).toBeLessThan(1e-8);
        expect(relative(f.effect.robust.se, get(`${key}.fuzzyquadratic.hc0`))).toBeLessThan(1e-6);
      });
    }
  }

  it('the normal quantiles and CDF equal qnorm and pnorm', () => {
    for (const p of [0.005, 0.025, 0.1, 0.5, 0.9, 0.975]) {
      const want = get(`qnorm.${p}`);
      expect(Math.abs(normalQuantile(p) - want)).toBeLessThan(1e-14 * Math.max(1, Math.abs(want)));
    }
    for (const z of [-6, -3.2, -1.96, 0.4, 2.5]) expect(Math.abs(normalCdf(z) / get(`pnorm.${z}`) - 1)).toBeLessThan(1e-13);
  });
});

// Check values for the statistical building blocks. Each value's source is named beside it with
// where it is written up in tests/reference/SOURCES.md (calculated = recomputed there; from memory
// = said so there) or, where computed in this file, how.
import { sampleCorrelation } from 'simple-statistics';
import {
  cochranArmitage,
  fisherExact,
  holmAdjust,
  olsFit,
  pearson,
  wilsonInterval,
} from '../../../server/analysis';
import { normalTwoSidedP } from '../../../server/analysis/distributions';

describe('Wilson score interval', () => {
  it.each([
    // Newcombe (1998a), Stat Med 17:857–872, example 81/263 (SOURCES.md §6.1: values calculated, example set from memory)
    [81, 263, 0.2553, 0.3662],
    // Newcombe (1998a) example 0/20, the zero edge (SOURCES.md §6.1: calculated, example set from memory)
    [0, 20, 0, 0.1611],
    // SOURCES.md §6.1, further checks, all calculated
    [4, 20, 0.0807, 0.416],
    [5, 10, 0.2366, 0.7634],
    [0, 3, 0, 0.5615],
    [2, 3, 0.2077, 0.9385],
    [3, 3, 0.4385, 1],
  ])('%i/%i → %f–%f', (k, n, lo, hi) => {
    const [l, h] = wilsonInterval(k, n);
    expect(l).toBeCloseTo(lo, 4);
    expect(h).toBeCloseTo(hi, 4);
  });

  it('rejects impossible counts rather than returning a misleading interval', () => {
    expect(() => wilsonInterval(4, 3)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
  });

  it('widens with the confidence level', () => {
    const [l95, h95] = wilsonInterval(5, 10, 0.95);
    const [l99, h99] = wilsonInterval(5, 10, 0.99);
    expect(l99).toBeLessThan(l95);
    expect(h99).toBeGreaterThan(h95);
  });
});

describe("Fisher's exact test", () => {
  // Lady tasting tea: Fisher, The Design of Experiments (1935); 8 cups, 4 with milk first.
  // Rows: cups with milk first / tea first; columns: called milk first / called tea first.
  it('all four identified: one-sided 1/70 = 0.014286, two-sided 0.028571 (Fisher 1935; SOURCES.md §6.3, calculated)', () => {
    const r = fisherExact(4, 0, 0, 4);
    expect(r.greater).toBeCloseTo(1 / 70, 6);
    expect(r.greater).toBeCloseTo(0.014286, 6);
    expect(r.twoSided).toBeCloseTo(0.028571, 6);
    expect(r.less).toBeCloseTo(1, 10);
  });

  it('three of four identified: 17/70 = 0.242857 one-sided (Fisher 1935; SOURCES.md §6.3, calculated)', () => {
    const r = fisherExact(3, 1, 1, 3);
    expect(r.greater).toBeCloseTo(17 / 70, 6);
    expect(r.greater).toBeCloseTo(0.242857, 6);
    // Lower tail P(X ≤ 3) = 1 − P(X = 4) = 69/70 [hand].
    expect(r.less).toBeCloseTo(69 / 70, 6);
  });

  it('one-sided tails of the same table sum to 1 + P(observed) [hand: P(X=3) = 16/70]', () => {
    const r = fisherExact(3, 1, 1, 3);
    expect(r.greater + r.less).toBeCloseTo(1 + 16 / 70, 10);
  });
});

describe('Ordinary least squares', () => {
  // NIST StRD Norris (lower difficulty, n = 36). Data as in NIST's Norris.dat; copied from the
  // public test file of the GNU Scientific Library (fit/test.c), which agrees with its Java port.
  const norrisX = [
    0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0,
    447.5, 11.6, 556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3,
    229.2, 669.1, 448.9, 0.5,
  ];
  const norrisY = [
    0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3,
    448.9, 10.8, 557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6,
    228.9, 668.4, 449.2, 0.2,
  ];

  it('matches the NIST StRD Norris certified values (SOURCES.md §6.9: certified values)', () => {
    expect(norrisX).toHaveLength(36);
    expect(norrisY).toHaveLength(36);
    const fit = olsFit(norrisX, norrisY);
    expect(fit).not.toBeNull();
    if (!fit) return;
    // Certified: slope 1.00211681802045, intercept −0.262323073774029, R² 0.999993745883712,
    // residual SD 0.884796396144373, SE of slope 4.29796848199937e-4. Required to 4 decimals;
    // asserted far tighter because double precision allows it on this lower-difficulty set.
    expect(fit.slope).toBeCloseTo(1.00211681802045, 10);
    expect(fit.intercept).toBeCloseTo(-0.262323073774029, 9);
    expect(fit.rSquared).toBeCloseTo(0.999993745883712, 10);
    expect(fit.residualSd).toBeCloseTo(0.884796396144373, 9);
    expect(fit.slopeSe).toBeCloseTo(4.29796848199937e-4, 12);
    expect(fit.slopeSe / 4.29796848199937e-4).toBeCloseTo(1, 7);
  });

  it('slope p on four points equals 1 − |r| [hand: t on 2 df has CDF ½ + t/(2√(2+t²)), and t = r√(2/(1−r²))]', () => {
    // x = 1..4, y = 1,3,2,4: Sxy = 4, Sxx = Syy = 5 → slope 0.8, r = 0.8 → p = 0.2 [hand].
    const fit = olsFit([1, 2, 3, 4], [1, 3, 2, 4]);
    expect(fit?.slope).toBeCloseTo(0.8, 12);
    expect(fit?.intercept).toBeCloseTo(0.5, 12);
    expect(fit?.slopeP).toBeCloseTo(0.2, 8);
  });

  it('is not estimable without spread in x or with fewer than 3 points', () => {
    expect(olsFit([2, 2, 2, 2], [1, 2, 3, 4])).toBeNull();
    expect(olsFit([1, 2], [1, 2])).toBeNull();
  });
});

describe('Pearson correlation', () => {
  it('n = 4: r = 0.8, p = 0.2 [hand: on 2 df the two-sided p is exactly 1 − |r|]', () => {
    const c = pearson([1, 2, 3, 4], [1, 3, 2, 4]);
    expect(c?.r).toBeCloseTo(0.8, 12);
    expect(c?.p).toBeCloseTo(0.2, 8);
    expect(c?.n).toBe(4);
  });

  it('n = 5: r = 6/√60, p = 0.124027 [hand: t = 3/√2 on 3 df, closed-form CDF below]', () => {
    // x = 1..5, y = 2,4,5,4,5: Sxy = 6, Sxx = 10, Syy = 6 → r = 6/√60 = 0.774597 [hand].
    const c = pearson([1, 2, 3, 4, 5], [2, 4, 5, 4, 5]);
    expect(c?.r).toBeCloseTo(6 / Math.sqrt(60), 12);
    // Student t with 3 df: F(t) = ½ + (1/π)[t/(√3(1 + t²/3)) + atan(t/√3)], evaluated here
    // independently of jstat; two-sided p = 2(1 − F(|t|)) = 1 − 2(0.489898 + 0.886077)/π = 0.124027 [hand].
    const t = 3 / Math.sqrt(2);
    const cdf = 0.5 + (t / (Math.sqrt(3) * (1 + (t * t) / 3)) + Math.atan(t / Math.sqrt(3))) / Math.PI;
    expect(c?.p).toBeCloseTo(2 * (1 - cdf), 8);
    expect(c?.p).toBeCloseTo(0.124027, 5);
  });

  it('a sign flip keeps p and flips r; no spread gives no correlation', () => {
    const up = pearson([1, 2, 3, 4, 5], [2, 4, 5, 4, 5]);
    const down = pearson([1, 2, 3, 4, 5], [-2, -4, -5, -4, -5]);
    expect(down?.r).toBeCloseTo(-(up?.r ?? 0), 12);
    expect(down?.p).toBeCloseTo(up?.p ?? -1, 12);
    expect(pearson([1, 2, 3], [5, 5, 5])).toBeNull();
  });
});

describe('Holm step-down adjustment', () => {
  it('adjusts [0.01, 0.04, 0.03, 0.005] to [0.03, 0.06, 0.06, 0.02] [hand]', () => {
    // Sorted: 0.005×4 = 0.02, 0.01×3 = 0.03, 0.03×2 = 0.06, 0.04×1 = 0.04 → raised to 0.06 to stay monotone.
    const adj = holmAdjust([0.01, 0.04, 0.03, 0.005]);
    [0.03, 0.06, 0.06, 0.02].forEach((v, i) => expect(adj[i]).toBeCloseTo(v, 12));
  });

  it('caps at 1 and leaves a single test alone [hand]', () => {
    expect(holmAdjust([0.4, 0.5])).toEqual([0.8, 0.8]);
    expect(holmAdjust([0.6, 0.7, 0.9])).toEqual([1, 1, 1]);
    expect(holmAdjust([0.03])).toEqual([0.03]);
  });
});

describe('Cochran–Armitage trend test', () => {
  // Elevated troponin T in stroke patients (Indredavik et al. 2008), 5 ordered groups with
  // (cases, non-cases) = (8,53), (10,48), (11,100), (22,102), (6,129), scores 1..5: the worked
  // example of Fagerland, Lydersen & Laake, Statistical Analysis of Contingency Tables (2017),
  // ch. 5. Their R package "contingencytables" (tests/testthat/test-ch5.R) asserts for it
  // "Mantel-Haenszel test: T = -1.790, P = 0.07351", where its code defines
  // Z_MH = √(N/(N−1))·Z_CA — so our Z_CA scaled that way must print the same.
  const troponin = [
    { score: 1, k: 8, n: 61 },
    { score: 2, k: 10, n: 58 },
    { score: 3, k: 11, n: 111 },
    { score: 4, k: 22, n: 124 },
    { score: 5, k: 6, n: 135 },
  ];
  const N = troponin.reduce((s, g) => s + g.n, 0);

  it('reproduces the published Mantel–Haenszel form T = −1.790, P = 0.07351 (contingencytables test-ch5.R)', () => {
    const { z } = cochranArmitage(troponin);
    const zMH = Math.sqrt(N / (N - 1)) * z;
    expect(zMH.toFixed(3)).toBe('-1.790');
    expect(normalTwoSidedP(zMH).toFixed(5)).toBe('0.07351');
  });

  it('equals √N·r of the individual-level correlation of outcome and score (independent check with simple-statistics)', () => {
    // Algebraic identity: Z_CA² = N·r², r = Pearson correlation over the N individual (score, 0/1) pairs.
    const scores: number[] = [];
    const outcomes: number[] = [];
    for (const g of troponin) {
      for (let i = 0; i < g.n; i++) {
        scores.push(g.score);
        outcomes.push(i < g.k ? 1 : 0);
      }
    }
    const r = sampleCorrelation(scores, outcomes);
    const { z, p } = cochranArmitage(troponin);
    expect(z).toBeCloseTo(Math.sqrt(N) * r, 10);
    expect(p).toBeGreaterThan(0.05);
    expect(p).toBeLessThan(0.1);
  });

  it('is zero, p = 1, with no variation to test', () => {
    expect(cochranArmitage([{ score: 0, n: 3, k: 3 }, { score: 1, n: 3, k: 3 }])).toEqual({ z: 0, p: 1 });
    expect(cochranArmitage([{ score: 0, n: 3, k: 1 }])).toEqual({ z: 0, p: 1 });
  });

  it('is invariant to a linear change of scores and flips sign with reversed order', () => {
    const a = cochranArmitage(troponin);
    const b = cochranArmitage(troponin.map((g) => ({ ...g, score: 10 + 3 * g.score })));
    const c = cochranArmitage(troponin.map((g) => ({ ...g, score: -g.score })));
    expect(b.z).toBeCloseTo(a.z, 12);
    expect(c.z).toBeCloseTo(-a.z, 12);
  });
});

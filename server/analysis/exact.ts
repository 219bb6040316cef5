// Exact rational arithmetic for decisions that sit on a boundary. A one-sided Fisher p of a small
// table is a fraction such as 1/20; in floating point it may come out as 0.049999999999999996 and
// pass "p < 0.05" when it is exactly 0.05. Decisions at α are taken on the exact fraction.

export interface Fraction {
  num: bigint;
  den: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

export function reduce(f: Fraction): Fraction {
  const g = gcd(f.num, f.den) || 1n;
  return { num: f.num / g, den: f.den / g };
}

/** Binomial coefficient C(n, k) as an exact integer. */
export function choose(n: number, k: number): bigint {
  if (k < 0 || k > n) return 0n;
  const kk = Math.min(k, n - k);
  let out = 1n;
  for (let i = 1; i <= kk; i++) out = (out * BigInt(n - kk + i)) / BigInt(i);
  return out;
}

/**
 * One-sided Fisher exact p as a fraction, for the 2×2 table [a b; c d]: P(X ≥ a) with X the
 * first row's successes, hypergeometric given the margins (the same test as fisherExact().greater).
 */
export function fisherGreaterExact(a: number, b: number, c: number, d: number): Fraction {
  const row1 = a + b;
  const col1 = a + c;
  const total = a + b + c + d;
  if (total === 0) return { num: 1n, den: 1n };
  const hi = Math.min(row1, col1);
  let num = 0n;
  for (let x = a; x <= hi; x++) num += choose(col1, x) * choose(total - col1, row1 - x);
  return reduce({ num, den: choose(total, row1) });
}

/** A decimal such as 0.05 as the fraction it was written as (5/100 → 1/20). */
export function decimalFraction(x: number): Fraction {
  if (!Number.isFinite(x)) throw new RangeError('decimalFraction: not a finite number');
  // Number#toString gives the shortest decimal that reads back as x, e.g. "0.05" or "1e-7".
  const [mantissa, exponentText] = x.toString().split('e');
  const exponent = Number(exponentText ?? 0);
  const [whole, frac = ''] = (mantissa as string).split('.');
  let num = BigInt(`${whole}${frac}`);
  let den = 10n ** BigInt(frac.length);
  if (exponent > 0) num *= 10n ** BigInt(exponent);
  else if (exponent < 0) den *= 10n ** BigInt(-exponent);
  return reduce({ num, den });
}

/** a < b, exactly. Denominators are positive. */
export function lessThan(a: Fraction, b: Fraction): boolean {
  return a.num * b.den < b.num * a.den;
}

/** The fraction as the nearest double (safe for huge numerators and denominators). */
export function toNumber(f: Fraction): number {
  if (f.num === 0n) return 0;
  if (f.num <= BigInt(Number.MAX_SAFE_INTEGER) && f.den <= BigInt(Number.MAX_SAFE_INTEGER)) return Number(f.num) / Number(f.den);
  const scale = 10n ** 30n;
  return Number((f.num * scale) / f.den) / 1e30;
}

/** "1/20" for a fraction small enough to read, else null (and null for 0 and 1, which read as they are). */
export function fractionText(f: Fraction): string | null {
  return f.den > 1n && f.num > 0n && f.den <= 100000n ? `${f.num}/${f.den}` : null;
}

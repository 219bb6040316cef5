// Number formatting for the plain-language reasons. Reasons are read by designers and graders,
// so numbers are rounded to what a person can take in; the exact values sit beside them in JSON.
import type { Direction } from './types';

export function pct(x: number): string {
  return `${Math.round(x * 100)}%`;
}

export function pValue(p: number): string {
  if (p < 0.0001) return 'p < 0.0001';
  return `p = ${p < 0.001 ? p.toPrecision(2) : p.toFixed(4).replace(/0+$/, '').replace(/\.$/, '')}`;
}

export function mm(x: number): string {
  const text = x.toFixed(1).replace(/\.0$/, '');
  return `${text === '-0' ? '0' : text} mm`.replace('-', '−');
}

export function num(x: number, digits = 2): string {
  return x.toFixed(digits).replace('-', '−');
}

export function testersWord(n: number): string {
  return n === 1 ? '1 tester' : `${n} testers`;
}

export function sizesList(sizes: readonly string[]): string {
  const quoted = sizes.map((s) => `size ${s}`);
  if (quoted.length <= 1) return quoted.join('');
  return `${quoted.slice(0, -1).join(', ')} and ${quoted[quoted.length - 1]}`;
}

export function directionVerb(direction: Direction): string {
  return direction === 'add' ? 'added' : 'took out';
}

export function describeKind(kind: string, direction: Direction): string {
  return `${kind} (${direction})`;
}

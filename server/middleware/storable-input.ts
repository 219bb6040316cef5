import type { RequestHandler } from 'express';
import { badRequest } from '../errors';

/** Nesting beyond this is no form Basted has (the deepest, a chart's variant values, is 5). */
export const MAX_DEPTH = 32;

// A UTF-16 surrogate half without its partner: not a character, and PostgreSQL refuses it.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function textProblem(value: string): string | null {
  // PostgreSQL text cannot hold U+0000 at all (jsonb refuses it; other drivers turn it into "\0").
  if (value.includes('\u0000')) return 'contains a NUL character, which cannot be stored';
  if (LONE_SURROGATE.test(value)) return 'contains a broken character (an unpaired surrogate), which cannot be stored';
  return null;
}

/**
 * Every text in a request body or query that cannot be stored as it was typed, by path ("notes",
 * "alterations.2.note"), with a reason; keys named __proto__ (which would reach an object's
 * prototype when merged) and nesting deeper than MAX_DEPTH are named too. Iterative, so a
 * hostile depth cannot exhaust the stack.
 */
export function unstorableParts(input: unknown, root = ''): Record<string, string> {
  const problems: Record<string, string> = {};
  const stack: { value: unknown; path: string; depth: number }[] = [{ value: input, path: root, depth: 0 }];
  while (stack.length) {
    const { value, path, depth } = stack.pop()!;
    if (typeof value === 'string') {
      const problem = textProblem(value);
      if (problem) problems[path || '_'] ??= problem;
      continue;
    }
    if (value === null || typeof value !== 'object') continue;
    if (depth >= MAX_DEPTH) {
      problems[path || '_'] ??= `is nested more than ${MAX_DEPTH} levels deep`;
      continue;
    }
    for (const key of Object.keys(value)) {
      const at = path ? `${path}.${key}` : key;
      const keyProblem = key === '__proto__' ? 'is not an allowed name' : textProblem(key);
      if (keyProblem) {
        // The bad characters are shown as "?" so the field name in the answer is itself storable.
        problems[at.replace(/[\u0000\uD800-\uDFFF]/g, '?')] ??= key === '__proto__' ? keyProblem : `its name ${keyProblem}`;
        continue;
      }
      stack.push({ value: (value as Record<string, unknown>)[key], path: at, depth: depth + 1 });
    }
  }
  return problems;
}

/** Throws a 400 naming each part of `input` that cannot be stored (see unstorableParts). */
export function assertStorable(input: unknown): void {
  const problems = unstorableParts(input);
  const named = Object.keys(problems);
  if (named.length) throw badRequest(`Please check: ${named.slice(0, 10).join(', ')}. Nothing was saved.`, problems);
}

/**
 * Before any route: a body or query with text PostgreSQL cannot hold is refused with 400 naming
 * the field, instead of failing deep in a save (a 500, or a NUL silently stored as "\0").
 */
export const storableInput: RequestHandler = (req, _res, next) => {
  assertStorable(req.query);
  if (req.body !== undefined) assertStorable(req.body);
  next();
};

// The analysis file format: a zod schema with messages that name the place of every problem,
// e.g. `reports[3].alterations[0].amountMm: expected a number`, so a designer can fix a file
// gathered in a spreadsheet without reading a stack trace.
import { z } from 'zod';
import type { AnalysisInput } from './types';

/** Sizes, testers and drafts are labels; accept 12 as well as "12" since spreadsheets export both. */
const label = z.preprocess(
  (v) => (typeof v === 'number' && Number.isFinite(v) ? String(v) : v),
  z.string({ error: 'expected a text label (string or number)' }).trim().min(1, { error: 'must not be empty' }),
);

const finite = z.number({ error: 'expected a number' });
const positive = finite.positive({ error: 'must be greater than 0' });

const alterationSchema = z.strictObject({
  kind: z.string({ error: 'expected a string' }).trim().min(1, { error: 'must not be empty' }),
  amountMm: finite.refine((v) => v !== 0, {
    error: 'must not be 0: a positive amount adds, a negative amount removes',
  }),
  note: z.string({ error: 'expected a string' }).optional(),
});

const fabricSchema = z.strictObject({
  widthMm: positive,
  usedMm: positive,
  napped: z.boolean({ error: 'expected true or false' }).default(false),
});

const reportSchema = z.strictObject({
  tester: label,
  size: label,
  draft: label.optional(),
  alterations: z.array(alterationSchema, { error: 'expected a list of alterations (may be empty)' }),
  bodyDeltaMm: z.record(z.string(), finite, { error: 'expected an object of kind → mm' }).optional(),
  fit: z
    .record(
      z.string(),
      finite
        .int({ error: 'expected a whole number from −2 to +2' })
        .min(-2, { error: 'must be between −2 and +2' })
        .max(2, { error: 'must be between −2 and +2' }),
      { error: 'expected an object of body area → rating' },
    )
    .optional(),
  fabric: fabricSchema.optional(),
  unclearSteps: z.array(label, { error: 'expected a list of step numbers' }).optional(),
  note: z.string({ error: 'expected a string' }).optional(),
});

const needSchema = z.strictObject({
  size: label,
  widthMm: positive,
  needMm: positive,
  napped: z.boolean({ error: 'expected true or false' }).default(false),
});

export const analysisFileSchema = z
  .strictObject({
    sizes: z.array(label, { error: 'expected a list of sizes, smallest first' }).min(1, { error: 'needs at least one size' }),
    reports: z.array(reportSchema, { error: 'expected a list of reports' }).min(1, { error: 'needs at least one report' }),
    fabricNeeds: z.array(needSchema, { error: 'expected a list of fabric needs' }).optional(),
    /** Findings the studio will fix in the next draft (for --changes). */
    willFix: z
      .array(
        z.strictObject({
          kind: z.string({ error: 'expected a string' }).trim().min(1, { error: 'must not be empty' }),
          direction: z.enum(['add', 'remove'], { error: 'expected "add" or "remove"' }),
        }),
        { error: 'expected a list of {kind, direction}' },
      )
      .optional(),
  }, { error: 'expected an object with "sizes" and "reports"' })
  .superRefine((file, ctx) => {
    const firstAt = new Map<string, number>();
    file.sizes.forEach((s, i) => {
      if (firstAt.has(s)) ctx.addIssue({ code: 'custom', path: ['sizes', i], message: `duplicate size "${s}"` });
      else firstAt.set(s, i);
    });
    const known = new Set(file.sizes);
    const shown = file.sizes.length > 12 ? `${file.sizes.slice(0, 12).join(', ')}, …` : file.sizes.join(', ');
    const seen = new Map<string, number>();
    file.reports.forEach((r, i) => {
      if (!known.has(r.size)) {
        ctx.addIssue({ code: 'custom', path: ['reports', i, 'size'], message: `"${r.size}" is not one of the sizes (${shown})` });
      }
      const draft = r.draft ?? '1';
      const key = `${r.tester}\u0000${draft}`;
      const earlier = seen.get(key);
      if (earlier !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['reports', i, 'tester'],
          message: `tester "${r.tester}" already has a report for draft ${draft} (reports[${earlier}])`,
        });
      } else seen.set(key, i);
    });
    (file.fabricNeeds ?? []).forEach((n, i) => {
      if (!known.has(n.size)) {
        ctx.addIssue({ code: 'custom', path: ['fabricNeeds', i, 'size'], message: `"${n.size}" is not one of the sizes (${shown})` });
      }
    });
  });

/** `reports[3].alterations[0].amountMm`, with odd record keys quoted: `fit["upper arm"]`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else {
      const name = String(part);
      out += /^[A-Za-z_$][\w$]*$/.test(name) ? `${out ? '.' : ''}${name}` : `[${JSON.stringify(name)}]`;
    }
  }
  return out || '(file)';
}

function describeIssue(issue: z.core.$ZodIssue): string[] {
  if (issue.code === 'unrecognized_keys') {
    return issue.keys.map((k) => `${formatPath([...issue.path, k])}: unknown field (check the spelling)`);
  }
  if (issue.code === 'invalid_type' && issue.input === undefined) {
    return [`${formatPath(issue.path)}: is required`];
  }
  return [`${formatPath(issue.path)}: ${issue.message}`];
}

export type ParseResult =
  | { ok: true; input: AnalysisInput; willFix?: { kind: string; direction: 'add' | 'remove' }[] }
  | { ok: false; errors: string[] };

/** Validate a parsed JSON value as an analysis file; never throws. */
export function parseAnalysisInput(data: unknown): ParseResult {
  // reportInput lets a missing field ("is required") be told apart from a wrong type.
  const result = analysisFileSchema.safeParse(data, { reportInput: true });
  if (!result.success) {
    return { ok: false, errors: result.error.issues.flatMap(describeIssue) };
  }
  const file = result.data;
  const input: AnalysisInput = {
    sizes: file.sizes,
    reports: file.reports.map((r) => ({
      tester: r.tester,
      size: r.size,
      draft: r.draft ?? '1',
      alterations: r.alterations.map((a) => ({ kind: a.kind, amountMm: a.amountMm })),
      ...(r.bodyDeltaMm ? { bodyDeltaMm: r.bodyDeltaMm } : {}),
      ...(r.fit ? { fit: r.fit } : {}),
      ...(r.fabric ? { fabric: r.fabric } : {}),
      ...(r.unclearSteps ? { unclearSteps: r.unclearSteps } : {}),
    })),
    ...(file.fabricNeeds ? { fabricNeeds: file.fabricNeeds } : {}),
  };
  return { ok: true, input, ...(file.willFix ? { willFix: file.willFix } : {}) };
}

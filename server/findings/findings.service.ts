import { Application, Enrollment, FabricNeed, PatternSize, Report, type Trial } from '../../db/models';
import { AnalysisRequestError, runAnalysis, type AnalysisInput } from '../analysis';
import { ALTERATION_KINDS } from '../domain/alterations';
import { badRequest } from '../errors';

const MEASUREMENT_OF = new Map(ALTERATION_KINDS.map((k) => [k.key, k.measurement]));

/**
 * The engine's input from a trial's submitted final reports: each tester's size and draft, their
 * alterations, and for each kind that answers to a body measurement the tester's own difference
 * from the chart (from the measurements copied into their application), so personal fit can be
 * told apart from a pattern problem.
 */
export async function analysisInputFor(trial: Trial): Promise<AnalysisInput> {
  const sizes = await PatternSize.findAll({ where: { patternId: trial.patternId }, order: [['position', 'ASC']] });
  const sizeById = new Map(sizes.map((s) => [s.id, s]));
  const enrollments = await Enrollment.findAll({
    where: { trialId: trial.id },
    include: [
      { model: Report, as: 'reports', where: { stage: 'final' }, required: true },
      { model: Application, as: 'application' },
    ],
  });
  const reports: AnalysisInput['reports'] = [];
  for (const e of enrollments) {
    const report = (e as Enrollment & { reports?: Report[] }).reports?.[0];
    if (!report?.submittedAt) continue;
    const size = sizeById.get(e.sizeId);
    if (!size) continue;
    const body = ((e as Enrollment & { application?: Application }).application?.profileSnapshot.measurementsMm ?? {}) as Record<string, number>;
    const c = report.content;
    const bodyDeltaMm: Record<string, number> = {};
    for (const a of c.alterations ?? []) {
      const m = MEASUREMENT_OF.get(a.kind);
      if (m && typeof body[m] === 'number' && typeof size.bodyMm[m] === 'number') bodyDeltaMm[a.kind] = body[m] - size.bodyMm[m];
    }
    reports.push({
      tester: e.id,
      size: size.label,
      draft: String(c.draftVersion ?? 1),
      alterations: (c.alterations ?? []).map((a) => ({ kind: a.kind === 'other' ? `other: ${a.otherText}` : a.kind, amountMm: a.amountMm })),
      ...(Object.keys(bodyDeltaMm).length ? { bodyDeltaMm } : {}),
      ...(c.fit && Object.keys(c.fit).length ? { fit: c.fit as Record<string, number> } : {}),
      ...(c.fabric?.widthMm && c.fabric.usedMm ? { fabric: { widthMm: c.fabric.widthMm, usedMm: c.fabric.usedMm, napped: c.fabric.napped } } : {}),
      ...(c.unclearSteps?.length ? { unclearSteps: c.unclearSteps.map((s) => s.step) } : {}),
    });
  }
  const needs = await FabricNeed.findAll({ where: { patternId: trial.patternId } });
  return {
    sizes: sizes.map((s) => s.label),
    reports,
    ...(needs.length ? { fabricNeeds: needs.map((n) => ({ size: sizeById.get(n.sizeId)?.label ?? '?', widthMm: n.widthMm, needMm: n.lengthMm, napped: n.napped })) } : {}),
  };
}

/** Findings of one draft (default: the latest with reports), optionally compared with another. */
export async function findingsFor(trial: Trial, options: { draft?: string; compare?: [string, string] }) {
  const input = await analysisInputFor(trial);
  if (input.reports.length === 0) return { input: { testers: 0 }, result: null };
  try {
    return { input: { testers: input.reports.length }, result: runAnalysis(input, options) };
  } catch (error) {
    if (error instanceof AnalysisRequestError) throw badRequest(error.message, { draft: error.message });
    throw error;
  }
}

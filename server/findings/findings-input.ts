import { QueryTypes, type Transaction } from 'sequelize';
import { FabricNeed, OtherAlterationMapping, PatternSize, Trial } from '../../db/models';
import type { AnalysisInput } from '../analysis';
import { ALTERATION_KINDS } from '../domain/alterations';
import { otherTextKey } from '../domain/schemas/findings';
import { countedAlterations, countedUnclearSteps, type AlterationEntry } from '../domain/schemas/reports';

const MEASUREMENT_OF = new Map(ALTERATION_KINDS.map((k) => [k.key, k.measurement]));

/** How a coordinator read each "other" alteration of a trial: its words (as otherTextKey) → kind. */
export async function otherMappingsOf(trialId: string, transaction?: Transaction): Promise<Map<string, string>> {
  return new Map((await OtherAlterationMapping.findAll({ where: { trialId }, attributes: ['textKey', 'kind'], transaction })).map((m) => [m.textKey, m.kind]));
}

type ReportLike = { submittedAt: Date | null; stage: 'check-in' | 'final'; content: { draftVersion?: number | null } };

/**
 * The reports that speak for each tester and draft: the submitted final report of that draft, or,
 * when the tester has none for it, their submitted check-in on that draft (a toile tells the
 * same fit story earlier). So a check-in on draft 1 and a final report on draft 2 give the tester
 * a voice in both drafts, and nobody counts twice in one draft.
 */
export function reportsPerDraft<R extends ReportLike>(reports: R[]): R[] {
  const chosen = new Map<string, R>();
  for (const r of reports) {
    if (!r.submittedAt) continue;
    const draft = String(r.content.draftVersion ?? 1);
    const held = chosen.get(draft);
    if (!held || (held.stage === 'check-in' && r.stage === 'final')) chosen.set(draft, r);
  }
  return [...chosen.values()];
}

type Alteration = { kind: string; otherText?: string; amountMm: number };
/** One submitted report with only the parts of its content the engine reads. */
type Row = {
  enrollment_id: string;
  size_id: string;
  stage: 'check-in' | 'final';
  body: Record<string, number> | null;
  draft_version: number | null;
  alterations: Alteration[] | null;
  fit: Record<string, number> | null;
  fabric: { widthMm?: number | null; usedMm?: number | null; napped?: boolean } | null;
  unclear: { step: string; problem: string }[] | null;
};
type Packed = [string, string, Row['stage'], Row['body'], Row['draft_version'], Row['alterations'], Row['fit'], Row['fabric'], Row['unclear']];

/**
 * The submitted reports of a trial with only the columns and parts of the content the engine
 * needs, in one query: enrolment, size, stage, the measurements copied into the application, and
 * the report's draft, alterations, fit, fabric and unclear steps. PostgreSQL packs them into one
 * JSON text, read with one JSON.parse (thousands of rows, no per-row overhead, no model instances).
 */
async function submittedRows(trialId: string, transaction?: Transaction): Promise<Row[]> {
  const [packed] = await Trial.sequelize!.query<{ rows: string | null }>(
    `SELECT json_agg(json_build_array(e.id, e.size_id, r.stage, a.profile_snapshot -> 'measurementsMm', r.content -> 'draftVersion',
              r.content -> 'alterations', r.content -> 'fit', r.content -> 'fabric', r.content -> 'unclearSteps')
              ORDER BY e.created_at, e.id, r.created_at, r.id)::text AS rows
       FROM enrollments e
       JOIN reports r ON r.enrollment_id = e.id AND r.submitted_at IS NOT NULL
       LEFT JOIN applications a ON a.id = e.application_id
      WHERE e.trial_id = $1`,
    { bind: [trialId], type: QueryTypes.SELECT, transaction },
  );
  const rows = packed?.rows ? (JSON.parse(packed.rows) as Packed[]) : [];
  return rows.map(([enrollment_id, size_id, stage, body, draft_version, alterations, fit, fabric, unclear]) => ({ enrollment_id, size_id, stage, body, draft_version, alterations, fit, fabric, unclear }));
}

/**
 * The engine's input from a trial's submitted reports (see reportsPerDraft): each tester's size
 * and draft, their alterations, and for each kind that answers to a body measurement the tester's
 * own difference from the chart (from the measurements copied into their application), so
 * personal fit can be told apart from a pattern problem.
 */
export async function analysisInputFor(trial: Pick<Trial, 'id' | 'patternId'>, transaction?: Transaction): Promise<AnalysisInput> {
  // One after another: inside a transaction they share its one connection.
  const sizes = await PatternSize.findAll({ where: { patternId: trial.patternId }, attributes: ['id', 'label', 'bodyMm'], order: [['position', 'ASC']], transaction });
  const rows = await submittedRows(trial.id, transaction);
  const mapped = await otherMappingsOf(trial.id, transaction);
  const needs = await FabricNeed.findAll({ where: { patternId: trial.patternId }, attributes: ['sizeId', 'widthMm', 'lengthMm', 'napped'], transaction });
  const sizeById = new Map(sizes.map((s) => [s.id, s]));
  const kindOf = (a: Alteration) => (a.kind === 'other' ? (mapped.get(otherTextKey(a.otherText ?? '')) ?? `other: ${(a.otherText ?? '').trim()}`) : a.kind);
  // Rows come ordered by enrolment: gather each enrolment's reports, then pick per draft.
  const reports: AnalysisInput['reports'] = [];
  const flush = (group: Row[]) => {
    const size = sizeById.get(group[0].size_id);
    if (!size) return;
    const body = group[0].body ?? {};
    const chart = size.bodyMm as Record<string, number>;
    const chosen = reportsPerDraft(group.map((r) => ({ submittedAt: new Date(0), stage: r.stage, content: { draftVersion: r.draft_version }, row: r })));
    for (const { row: c } of chosen) {
      // The tester's own difference from the chart for every kind that answers to a measurement,
      // whether or not they made it: personal fit compares those who changed nothing too.
      const bodyDeltaMm: Record<string, number> = {};
      for (const [kind, m] of MEASUREMENT_OF) {
        if (m && typeof body[m] === 'number' && typeof chart[m] === 'number') bodyDeltaMm[kind] = body[m] - chart[m];
      }
      // Only complete answers count: an alteration with its kind and amount, a step with its problem.
      const alterations = countedAlterations({ alterations: (c.alterations ?? []) as AlterationEntry[] });
      const kinds = alterations.map((a) => kindOf(a as Alteration));
      for (const kind of kinds) {
        const m = MEASUREMENT_OF.get(kind);
        if (m && typeof body[m] === 'number' && typeof chart[m] === 'number') bodyDeltaMm[kind] = body[m] - chart[m];
      }
      reports.push({
        tester: c.enrollment_id,
        size: size.label,
        draft: String(c.draft_version ?? 1),
        alterations: alterations.map((a, i) => ({ kind: kinds[i], amountMm: a.amountMm })),
        ...(Object.keys(bodyDeltaMm).length ? { bodyDeltaMm } : {}),
        ...(c.fit && Object.keys(c.fit).length ? { fit: c.fit } : {}),
        ...(c.fabric?.widthMm && c.fabric.usedMm ? { fabric: { widthMm: c.fabric.widthMm, usedMm: c.fabric.usedMm, napped: c.fabric.napped } } : {}),
        ...(countedUnclearSteps({ unclearSteps: c.unclear ?? [] }).length ? { unclearSteps: countedUnclearSteps({ unclearSteps: c.unclear ?? [] }).map((s) => s.step) } : {}),
      } as AnalysisInput['reports'][number]);
    }
  };
  let group: Row[] = [];
  for (const row of rows) {
    if (group.length && group[0].enrollment_id !== row.enrollment_id) {
      flush(group);
      group = [];
    }
    group.push(row);
  }
  if (group.length) flush(group);
  return {
    sizes: sizes.map((s) => s.label),
    reports,
    ...(needs.length ? { fabricNeeds: needs.map((n) => ({ size: sizeById.get(n.sizeId)?.label ?? '?', widthMm: n.widthMm, needMm: n.lengthMm, napped: n.napped })) } : {}),
  };
}

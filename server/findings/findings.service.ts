import { createHash } from 'node:crypto';
import type { z } from 'zod';
import {
  Application,
  Enrollment,
  FabricNeed,
  FindingNote,
  FindingSnapshot,
  FindingTriage,
  OtherAlterationMapping,
  PatternSize,
  Report,
  Studio,
  type Trial,
  User,
} from '../../db/models';
import { toCsv } from '../csv';
import { AnalysisRequestError, changeTable, findingName, listDrafts, readerFor, renderOutput, runAnalysis, type AnalysisInput } from '../analysis';
import type { AnalysisOutput, ChangeRow } from '../analysis/types';
import { ALTERATION_KINDS, alterationKindsFor } from '../domain/alterations';
import type { GarmentCategory } from '../domain/garments';
import { otherTextKey, type findingNoteSchema, type otherMappingSchema, type triageSchema } from '../domain/schemas/findings';
import { countedAlterations, countedUnclearSteps } from '../domain/schemas/reports';
import { studioThresholds } from '../domain/studio-settings';
import { badRequest } from '../errors';
import type { Thresholds } from '../analysis/thresholds';

const MEASUREMENT_OF = new Map(ALTERATION_KINDS.map((k) => [k.key, k.measurement]));

/**
 * Bumped whenever the engine's rules or output change, so stored snapshots from an older engine
 * are computed again rather than served.
 */
const ENGINE_VERSION = 3;

/** How a coordinator read each "other" alteration of a trial: its words (as otherTextKey) → kind. */
export async function otherMappingsOf(trialId: string): Promise<Map<string, string>> {
  return new Map((await OtherAlterationMapping.findAll({ where: { trialId } })).map((m) => [m.textKey, m.kind]));
}

/**
 * The reports that speak for each tester and draft: the submitted final report of that draft, or,
 * when the tester has none for it, their submitted check-in on that draft (a toile tells the
 * same fit story earlier). So a check-in on draft 1 and a final report on draft 2 give the tester
 * a voice in both drafts, and nobody counts twice in one draft.
 */
export function reportsPerDraft(reports: Report[]): Report[] {
  const chosen = new Map<string, Report>();
  for (const r of reports) {
    if (!r.submittedAt) continue;
    const draft = String(r.content.draftVersion ?? 1);
    const held = chosen.get(draft);
    if (!held || (held.stage === 'check-in' && r.stage === 'final')) chosen.set(draft, r);
  }
  return [...chosen.values()];
}

/**
 * The engine's input from a trial's submitted reports (see reportsPerDraft): each tester's size
 * and draft, their alterations, and for each kind that answers to a body measurement the tester's
 * own difference from the chart (from the measurements copied into their application), so
 * personal fit can be told apart from a pattern problem.
 */
export async function analysisInputFor(trial: Trial): Promise<AnalysisInput> {
  const sizes = await PatternSize.findAll({ where: { patternId: trial.patternId }, order: [['position', 'ASC']] });
  const sizeById = new Map(sizes.map((s) => [s.id, s]));
  const enrollments = await Enrollment.findAll({
    where: { trialId: trial.id },
    include: [
      { model: Report, as: 'reports', required: true },
      { model: Application, as: 'application' },
    ],
  });
  const mapped = await otherMappingsOf(trial.id);
  const kindOf = (a: { kind: string; otherText: string }) => (a.kind === 'other' ? (mapped.get(otherTextKey(a.otherText)) ?? `other: ${a.otherText.trim()}`) : a.kind);
  const reports: AnalysisInput['reports'] = [];
  for (const e of enrollments) {
    const size = sizeById.get(e.sizeId);
    if (!size) continue;
    const body = ((e as Enrollment & { application?: Application }).application?.profileSnapshot.measurementsMm ?? {}) as Record<string, number>;
    for (const report of reportsPerDraft((e as Enrollment & { reports?: Report[] }).reports ?? [])) {
      const c = report.content;
      // The tester's own difference from the chart for every kind that answers to a measurement,
      // whether or not they made it: personal fit compares those who changed nothing too.
      const bodyDeltaMm: Record<string, number> = {};
      for (const [kind, m] of MEASUREMENT_OF) {
        if (m && typeof body[m] === 'number' && typeof size.bodyMm[m] === 'number') bodyDeltaMm[kind] = body[m] - size.bodyMm[m];
      }
      for (const a of countedAlterations(c)) {
        const kind = kindOf(a);
        const m = MEASUREMENT_OF.get(kind);
        if (m && typeof body[m] === 'number' && typeof size.bodyMm[m] === 'number') bodyDeltaMm[kind] = body[m] - size.bodyMm[m];
      }
      reports.push({
        tester: e.id,
        size: size.label,
        draft: String(c.draftVersion ?? 1),
        alterations: countedAlterations(c).map((a) => ({ kind: kindOf(a), amountMm: a.amountMm })),
        ...(Object.keys(bodyDeltaMm).length ? { bodyDeltaMm } : {}),
        ...(c.fit && Object.keys(c.fit).length ? { fit: c.fit as Record<string, number> } : {}),
        ...(c.fabric?.widthMm && c.fabric.usedMm ? { fabric: { widthMm: c.fabric.widthMm, usedMm: c.fabric.usedMm, napped: c.fabric.napped } } : {}),
        ...(countedUnclearSteps(c).length ? { unclearSteps: countedUnclearSteps(c).map((s) => s.step) } : {}),
      });
    }
  }
  const needs = await FabricNeed.findAll({ where: { patternId: trial.patternId } });
  return {
    sizes: sizes.map((s) => s.label),
    reports,
    ...(needs.length ? { fabricNeeds: needs.map((n) => ({ size: sizeById.get(n.sizeId)?.label ?? '?', widthMm: n.widthMm, needMm: n.lengthMm, napped: n.napped })) } : {}),
  };
}

type FindingKey = { kind: string; direction: 'add' | 'remove' };
const keyOf = (f: FindingKey) => `${f.direction}\u0000${f.kind}`;

/** Same input, same thresholds → same findings: the snapshot is reused while this hash holds. */
function sourceHash(input: AnalysisInput, thresholds: Thresholds): string {
  return createHash('sha256').update(JSON.stringify({ engine: ENGINE_VERSION, input, thresholds })).digest('hex');
}

async function thresholdsOf(trial: Trial): Promise<Thresholds> {
  return studioThresholds((await Studio.findByPk(trial.studioId))?.settings);
}

function analyse(input: AnalysisInput, options: { draft?: string; compare?: [string, string] }, thresholds: Thresholds): AnalysisOutput {
  try {
    return runAnalysis(input, options, thresholds);
  } catch (error) {
    if (error instanceof AnalysisRequestError) throw badRequest(error.message, { draft: error.message });
    throw error;
  }
}

/**
 * Brings the stored snapshot of every draft of the trial up to date with its reports and the
 * studio's thresholds: a draft whose source changed is computed again, a draft left without
 * reports loses its snapshot. Called whenever reports, mappings or thresholds change.
 */
export async function refreshFindings(trial: Trial): Promise<FindingSnapshot[]> {
  const input = await analysisInputFor(trial);
  const thresholds = await thresholdsOf(trial);
  const hash = sourceHash(input, thresholds);
  const drafts = listDrafts(input);
  const stored = await FindingSnapshot.findAll({ where: { trialId: trial.id } });
  for (const old of stored) if (!drafts.includes(old.draft)) await old.destroy();
  const snapshots: FindingSnapshot[] = [];
  for (const draft of drafts) snapshots.push(await snapshotOf(trial, input, thresholds, hash, draft, stored));
  return snapshots;
}

async function snapshotOf(trial: Trial, input: AnalysisInput, thresholds: Thresholds, hash: string, draft: string, stored?: FindingSnapshot[]) {
  const held = stored ? stored.find((s) => s.draft === draft) : await FindingSnapshot.findOne({ where: { trialId: trial.id, draft } });
  if (held?.sourceHash === hash) return held;
  const result = analyse(input, { draft }, thresholds);
  const fields = { sourceHash: hash, testers: result.testers, result, computedAt: new Date() };
  if (held) return held.update(fields);
  // Two requests may compute the same draft at once: the unique key keeps one row.
  const [row] = await FindingSnapshot.upsert({ trialId: trial.id, draft, ...fields }, { conflictFields: ['trial_id', 'draft'] as never });
  return row;
}

/** Safe to call after a tester's change: a failure to recompute is logged, never the tester's problem. */
export async function refreshFindingsQuietly(trial: Trial): Promise<void> {
  try {
    await refreshFindings(trial);
  } catch (error) {
    console.error('[findings] could not recompute', trial.id, error instanceof Error ? error.message : error);
  }
}

/** Triage and notes of every finding of a trial, keyed by kind and direction. */
async function decisionsOf(trialId: string) {
  const triage = await FindingTriage.findAll({ where: { trialId }, include: [{ model: User, as: 'updatedBy', attributes: ['name'] }] });
  const notes = await FindingNote.findAll({ where: { trialId }, include: [{ model: User, as: 'author', attributes: ['name'] }], order: [['createdAt', 'ASC']] });
  const byKey = new Map<string, { triage: ReturnType<typeof serializeTriage>; notes: ReturnType<typeof serializeNote>[] }>();
  const entry = (f: FindingKey) => {
    const key = keyOf(f);
    if (!byKey.has(key)) byKey.set(key, { triage: { state: 'open', fixedInDraft: null, updatedAt: null, updatedBy: null }, notes: [] });
    return byKey.get(key)!;
  };
  for (const t of triage) entry(t).triage = serializeTriage(t);
  for (const n of notes) entry(n).notes.push(serializeNote(n));
  return { of: (f: FindingKey) => byKey.get(keyOf(f)) ?? { triage: serializeTriage(null), notes: [] } };
}

function serializeTriage(t: FindingTriage | null) {
  if (!t) return { state: 'open' as const, fixedInDraft: null, updatedAt: null, updatedBy: null };
  return { state: t.state, fixedInDraft: t.fixedInDraft, updatedAt: t.updatedAt, updatedBy: (t as FindingTriage & { updatedBy?: User | null }).updatedBy?.name ?? null };
}

function serializeNote(n: FindingNote) {
  return { id: n.id, author: (n as FindingNote & { author?: User | null }).author?.name ?? 'A former member', body: n.body, createdAt: n.createdAt };
}

/** How a person reads lengths: their own units. */
export type ReaderUnits = { lengthUnit: 'in' | 'cm'; fabricUnit: 'yd' | 'm' };

/**
 * Findings of one draft (default: the latest with reports) from the stored snapshot, computed
 * again first if the reports or the thresholds changed since; optionally compared with another
 * draft. Every finding carries the studio's triage state and notes; the findings the studio will
 * fix get the change table. Reasons are written in the reader's units.
 */
export async function findingsFor(trial: Trial, options: { draft?: string; compare?: [string, string] }, units: ReaderUnits) {
  const input = await analysisInputFor(trial);
  if (input.reports.length === 0) return { input: { testers: 0 }, result: null, snapshot: null };
  const thresholds = await thresholdsOf(trial);
  const drafts = listDrafts(input);
  for (const asked of [options.draft, ...(options.compare ?? [])]) {
    if (asked !== undefined && !drafts.includes(asked)) {
      const message = `draft "${asked}" has no reports; drafts with reports: ${drafts.join(', ')}`;
      throw badRequest(message, { [options.draft === asked ? 'draft' : 'compare']: message });
    }
  }
  const draft = options.draft ?? options.compare?.[0] ?? drafts[drafts.length - 1];
  const snapshot = await snapshotOf(trial, input, thresholds, sourceHash(input, thresholds), draft);
  const decisions = await decisionsOf(trial.id);
  const findings = snapshot.result.findings.map((f) => ({ ...f, ...decisions.of(f) }));
  const willFix = findings.filter((f) => f.triage.state === 'will-fix').map((f) => ({ kind: f.kind, direction: f.direction }));
  const result: AnalysisOutput = { ...snapshot.result, drafts, findings, changes: changeTable(input, draft, snapshot.result.findings, willFix, thresholds) };
  if (options.compare) result.comparison = analyse(input, { compare: options.compare }, thresholds).comparison;
  return {
    input: { testers: input.reports.length },
    result: renderOutput(result, readerFor(units.lengthUnit, units.fabricUnit)),
    snapshot: { draft: snapshot.draft, computedAt: snapshot.computedAt, thresholds },
  };
}

/**
 * The change table of one draft as CSV, for the grader's spreadsheet: one row per finding the
 * studio will fix and size, the change in the reader's unit beside the exact millimetres.
 */
export async function changesCsv(trial: Trial, draftAsked: string | undefined, units: ReaderUnits): Promise<string> {
  const { result } = await findingsFor(trial, { draft: draftAsked }, units);
  const reader = readerFor(units.lengthUnit, units.fabricUnit);
  const rows = (result?.changes ?? []).map((c: ChangeRow) => ({
    draft: result?.draft ?? '',
    finding: findingName(c),
    class: c.class,
    size: c.size,
    change: c.amountMm === null ? '' : reader.fine(c.amountMm),
    from: c.interval ? reader.fine(c.interval[0]) : '',
    to: c.interval ? reader.fine(c.interval[1]) : '',
    change_mm: c.amountMm === null ? '' : Math.round(c.amountMm * 10) / 10,
    from_mm: c.interval ? Math.round(c.interval[0] * 10) / 10 : '',
    to_mm: c.interval ? Math.round(c.interval[1] * 10) / 10 : '',
    basis: c.basis,
    extrapolated: c.extrapolated ? 'yes' : 'no',
    note: c.note,
  }));
  const fields = ['draft', 'finding', 'class', 'size', 'change', 'from', 'to', 'change_mm', 'from_mm', 'to_mm', 'basis', 'extrapolated', 'note'];
  // A tester's own words can name an "other" alteration: never let a cell start a formula.
  return toCsv({ fields, data: rows.map((r) => fields.map((f) => r[f as keyof typeof r])) });
}

/** Sets the studio's decision on a finding; returns its triage and notes. */
export async function triageFinding(trial: Trial, user: User, input: z.output<typeof triageSchema>) {
  const { kind, direction, state } = input;
  const fixedInDraft = state === 'fixed' ? (input.fixedInDraft ?? null) : null;
  const held = await FindingTriage.findOne({ where: { trialId: trial.id, kind, direction } });
  if (held) await held.update({ state, fixedInDraft, updatedById: user.id });
  else await FindingTriage.create({ trialId: trial.id, kind, direction, state, fixedInDraft, updatedById: user.id });
  return (await decisionsOf(trial.id)).of({ kind, direction });
}

export async function addFindingNote(trial: Trial, user: User, input: z.output<typeof findingNoteSchema>) {
  await FindingNote.create({ trialId: trial.id, kind: input.kind, direction: input.direction, body: input.body, authorId: user.id });
  return (await decisionsOf(trial.id)).of(input);
}

/**
 * The "other" alterations of a trial's reports, grouped by their words, with how many reports
 * use them and the kind a coordinator read them as.
 */
export async function otherAlterations(trial: Trial & { pattern?: { category: string } }) {
  const reports = await Report.findAll({ include: [{ model: Enrollment, as: 'enrollment', where: { trialId: trial.id }, attributes: [] }] });
  const mappings = await otherMappingsOf(trial.id);
  const groups = new Map<string, { text: string; reports: number; amountsMm: number[] }>();
  for (const r of reports) {
    for (const a of countedAlterations(r.content)) {
      if (a.kind !== 'other' || !a.otherText) continue;
      const key = otherTextKey(a.otherText);
      const g = groups.get(key) ?? { text: a.otherText.trim(), reports: 0, amountsMm: [] };
      g.reports += 1;
      g.amountsMm.push(a.amountMm);
      groups.set(key, g);
    }
  }
  return {
    kinds: alterationKindsFor((trial.pattern?.category ?? 'other') as GarmentCategory).filter((k) => k.key !== 'other').map((k) => ({ key: k.key, label: k.label })),
    items: [...groups.entries()].map(([key, g]) => ({ ...g, kind: mappings.get(key) ?? null })).sort((a, b) => b.reports - a.reports || a.text.localeCompare(b.text)),
  };
}

/** Reads an "other" alteration's words as a kind (or forgets that reading), then recomputes. */
export async function mapOtherAlteration(trial: Trial & { pattern?: { category: string } }, user: User, input: z.output<typeof otherMappingSchema>) {
  const textKey = otherTextKey(input.text);
  if (input.kind) {
    const allowed = alterationKindsFor((trial.pattern?.category ?? 'other') as GarmentCategory).some((k) => k.key === input.kind);
    if (!allowed) throw badRequest('That kind of alteration does not belong to this garment.', { kind: 'is not an alteration of this garment' });
    const held = await OtherAlterationMapping.findOne({ where: { trialId: trial.id, textKey } });
    if (held) await held.update({ kind: input.kind, mappedById: user.id });
    else await OtherAlterationMapping.create({ trialId: trial.id, textKey, kind: input.kind, mappedById: user.id });
  } else {
    await OtherAlterationMapping.destroy({ where: { trialId: trial.id, textKey } });
  }
  await refreshFindings(trial);
  return otherAlterations(trial);
}

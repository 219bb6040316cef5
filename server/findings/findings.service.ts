import { createHash } from 'node:crypto';
import type { z } from 'zod';
import { QueryTypes, type Transaction } from 'sequelize';
import { Enrollment, FindingNote, FindingSnapshot, FindingTriage, OtherAlterationMapping, Report, Studio, Trial, User } from '../../db/models';
import { toCsv } from '../csv';
import { AnalysisRequestError, changeTable, findingName, listDrafts, readerFor, renderOutput, runAnalysis, type AnalysisInput } from '../analysis';
import type { AnalysisOutput, ChangeRow } from '../analysis/types';
import { alterationKindsFor } from '../domain/alterations';
import type { GarmentCategory } from '../domain/garments';
import { otherTextKey, type findingNoteSchema, type otherMappingSchema, type triageSchema } from '../domain/schemas/findings';
import { countedAlterations } from '../domain/schemas/reports';
import { studioThresholds } from '../domain/studio-settings';
import { badRequest } from '../errors';
import type { Thresholds } from '../analysis/thresholds';
import { analysisInputFor, otherMappingsOf } from './findings-input';
import { refreshQueued } from './findings-jobs';

/**
 * Bumped whenever the engine's rules or output change, so stored snapshots from an older engine
 * are computed again rather than served.
 */
const ENGINE_VERSION = 3;

export { analysisInputFor, otherMappingsOf, reportsPerDraft } from './findings-input';

type FindingKey = { kind: string; direction: 'add' | 'remove' };
const keyOf = (f: FindingKey) => `${f.direction}\u0000${f.kind}`;
const changeKey = (f: FindingKey) => `${f.kind}|${f.direction}`;

/**
 * What a snapshot was computed from: the engine, the thresholds and the trial's revision (which
 * the database bumps on every write the findings depend on), so no hash of the whole input is needed.
 */
function sourceHash(config: string, revision: string): string {
  return createHash('sha256').update(`${config}:${revision}`).digest('hex');
}

/** The engine and thresholds the stored findings were computed with; a change makes them stale. */
function configHash(thresholds: Thresholds): string {
  return createHash('sha256').update(JSON.stringify({ engine: ENGINE_VERSION, thresholds })).digest('hex');
}

async function thresholdsOf(trial: Pick<Trial, 'studioId'>, transaction?: Transaction): Promise<Thresholds> {
  return studioThresholds((await Studio.findByPk(trial.studioId, { attributes: ['id', 'settings'], transaction }))?.settings);
}

function analyse(input: AnalysisInput, options: { draft?: string; compare?: [string, string] }, thresholds: Thresholds): AnalysisOutput {
  try {
    return runAnalysis(input, options, thresholds);
  } catch (error) {
    if (error instanceof AnalysisRequestError) throw badRequest(error.message, { draft: error.message });
    throw error;
  }
}

/** The change table of every finding of a draft, keyed "kind|direction" (rows in table order). */
function changesByFinding(input: AnalysisInput, draft: string, findings: AnalysisOutput['findings'], thresholds: Thresholds): Record<string, ChangeRow[]> {
  const out: Record<string, ChangeRow[]> = {};
  for (const row of changeTable(input, draft, findings, findings, thresholds)) (out[changeKey(row)] ??= []).push(row);
  return out;
}

type Freshness = { revision: string; computedRevision: string; configHash: string | null; computedAt: Date | null };

const isFresh = (f: Freshness, config: string) => String(f.computedRevision) === String(f.revision) && f.configHash === config;

/**
 * Brings the stored snapshot of every draft of the trial up to date with its reports and the
 * studio's thresholds: a draft whose source changed is computed again, a draft left without
 * reports loses its snapshot, and the trial records the revision it is now current with. One
 * recomputation per trial at a time (an advisory lock): a second caller waits, then finds the
 * work done. The revision is read before the reports, so a write during the computation leaves
 * the findings stale for the next run rather than labelled current.
 */
export async function refreshFindings(trial: Pick<Trial, 'id' | 'patternId' | 'studioId'>): Promise<Freshness> {
  const sequelize = Trial.sequelize!;
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('findings:' || $1))`, { bind: [trial.id], transaction });
    const [state] = await sequelize.query<{ revision: string; computedRevision: string; configHash: string | null; computedAt: Date | null }>(
      `SELECT findings_revision AS "revision", findings_computed_revision AS "computedRevision", findings_config_hash AS "configHash",
              findings_computed_at AS "computedAt" FROM trials WHERE id = $1`,
      { bind: [trial.id], type: QueryTypes.SELECT, transaction },
    );
    if (!state) return { revision: '0', computedRevision: '0', configHash: null, computedAt: null };
    const thresholds = await thresholdsOf(trial, transaction);
    const config = configHash(thresholds);
    if (isFresh(state, config)) return state;

    const input = await analysisInputFor(trial, transaction);
    const hash = sourceHash(config, String(state.revision));
    const drafts = listDrafts(input);
    const stored = await FindingSnapshot.findAll({ where: { trialId: trial.id }, attributes: ['id', 'draft', 'sourceHash'], transaction });
    for (const old of stored) if (!drafts.includes(old.draft)) await old.destroy({ transaction });
    const now = new Date();
    for (const draft of drafts) {
      const held = stored.find((s) => s.draft === draft);
      if (held?.sourceHash === hash) continue;
      const result = analyse(input, { draft }, thresholds);
      const fields = { sourceHash: hash, testers: result.testers, result, changes: changesByFinding(input, draft, result.findings, thresholds), reports: input.reports.length, computedAt: now };
      if (held) await FindingSnapshot.update(fields, { where: { id: held.id }, transaction });
      else await FindingSnapshot.upsert({ trialId: trial.id, draft, ...fields }, { conflictFields: ['trial_id', 'draft'] as never, transaction });
    }
    await sequelize.query(
      'UPDATE trials SET findings_computed_revision = $2, findings_config_hash = $3, findings_computed_at = $4 WHERE id = $1',
      { bind: [trial.id, state.revision, config, now], transaction },
    );
    return { revision: state.revision, computedRevision: state.revision, configHash: config, computedAt: now };
  });
}

/** Safe to call after a tester's change: a failure to recompute is logged, never the tester's problem. */
export async function refreshFindingsQuietly(trial: Pick<Trial, 'id' | 'patternId' | 'studioId'>): Promise<void> {
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
 * Findings of one draft (default: the latest with reports) from the stored snapshot, optionally
 * compared with another draft. While the stored findings are current (the trial's revision) no
 * report is loaded. When they are behind and a recomputation is waiting on the job queue, the
 * stored ones are served with `pending: true` (the screen asks again until it is done); otherwise
 * they are computed first. Every finding carries the studio's triage state and notes; the findings
 * the studio will fix get the change table. Reasons are written in the reader's units.
 */
export async function findingsFor(trial: Trial, options: { draft?: string; compare?: [string, string] }, units: ReaderUnits) {
  const thresholds = await thresholdsOf(trial);
  let state: Freshness = { revision: trial.findingsRevision, computedRevision: trial.findingsComputedRevision, configHash: trial.findingsConfigHash, computedAt: trial.findingsComputedAt };
  let pending = false;
  if (!isFresh(state, configHash(thresholds))) {
    // Serve what is stored while the queue counts the newest reports; compute here when nothing
    // would (no job waiting, new thresholds, or nothing stored yet).
    if (state.computedAt && state.configHash === configHash(thresholds) && (await refreshQueued(trial.id))) pending = true;
    else state = await refreshFindings(trial);
  }
  const computed = await FindingSnapshot.findAll({ where: { trialId: trial.id }, attributes: ['draft', 'reports'] });
  if (computed.length === 0) return { input: { testers: 0 }, result: null, snapshot: null, pending, computedAt: state.computedAt };
  const drafts = listDrafts({ sizes: [], reports: computed.map((c) => ({ tester: '', size: '', draft: c.draft, alterations: [] })) });
  for (const asked of [options.draft, ...(options.compare ?? [])]) {
    if (asked !== undefined && !drafts.includes(asked)) {
      const message = `draft "${asked}" has no reports; drafts with reports: ${drafts.join(', ')}`;
      throw badRequest(message, { [options.draft === asked ? 'draft' : 'compare']: message });
    }
  }
  const draft = options.draft ?? options.compare?.[0] ?? drafts[drafts.length - 1];
  const decisions = await decisionsOf(trial.id);
  const willFixKeys = (await FindingTriage.findAll({ where: { trialId: trial.id, state: 'will-fix' }, attributes: ['kind', 'direction'] })).map(changeKey);
  // Only the change rows of the findings the studio will fix leave the database.
  const [row] = await Trial.sequelize!.query<{ result: AnalysisOutput; computedAt: Date; reports: number; wanted: Record<string, ChangeRow[]> | null }>(
    `SELECT result, computed_at AS "computedAt", reports,
            (SELECT jsonb_object_agg(k, changes -> k) FROM unnest($3::text[]) AS k WHERE changes ? k) AS wanted
       FROM finding_snapshots WHERE trial_id = $1 AND draft = $2`,
    { bind: [trial.id, draft, willFixKeys], type: QueryTypes.SELECT },
  );
  const snapshot = row.result;
  const findings = snapshot.findings.map((f) => ({ ...f, ...decisions.of(f) }));
  const changes = findings.filter((f) => f.triage.state === 'will-fix').flatMap((f) => row.wanted?.[changeKey(f)] ?? []);
  const result: AnalysisOutput = { ...snapshot, drafts, findings, changes };
  if (options.compare) result.comparison = analyse(await analysisInputFor(trial), { compare: options.compare }, thresholds).comparison;
  return {
    input: { testers: row.reports },
    result: renderOutput(result, readerFor(units.lengthUnit, units.fabricUnit)),
    snapshot: { draft, computedAt: row.computedAt, thresholds },
    // Newer reports than these findings count are being counted by the job queue.
    pending,
    computedAt: state.computedAt,
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

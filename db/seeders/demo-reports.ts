import { randomUUID } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { loadConfig } from '../../server/config';
import type { ReportDraft } from '../../server/domain/schemas/reports';
import { addFindingNote, refreshFindingsQuietly, triageFinding } from '../../server/findings/findings.service';
import { addPhoto } from '../../server/photos/photos.service';
import { createStorage, type Storage } from '../../server/storage/storage';
import { Application, Draft, DraftDownload, DraftFile, Enrollment, FabricNeed, FindingTriage, Milestone, Pattern, PatternSize, Photo, Report, Studio, Trial, User } from '../models';
import { renderFigure, type FigureView } from './demo-figures';
// Only read inside functions, so the two seeders may import each other.
import { DEMO_STUDIO, DEMO_TRIAL_SLUG } from './demo-studio';
import { assemblePdf } from './minimal-pdf';

/**
 * The demo trial's second act: two draft versions of the demo trousers, the testers' check-ins on
 * the toile of draft 1 and their final reports on draft 2, and drawn photos of a few finished
 * pairs. Everything is invented, and the numbers are chosen so the findings show each class:
 *
 * - back crotch length added by most testers in every size on draft 1 (draft-wide), which draft 2
 *   fixes ("Rise lengthened …"), so the comparison of the drafts says fixed;
 * - the back crotch curve scooped only in the larger sizes, more the larger the size (grading);
 * - the leg shortened (or lengthened) by each tester's own inseam difference from the chart
 *   (personal fit);
 * - the waist taken in by the testers of size 10 only (size-specific);
 * - sizes 18 and 20 needing more fabric than the stated needs, and the fly front step unclear to
 *   several testers of draft 2.
 *
 * A few testers have not sent their final report yet, so the reminders have someone to remind.
 */

/** The size whose waist the demo testers take in. */
export const DEMO_WAIST_SIZE = '10';
/** Sizes whose testers need more fabric than the pattern states. */
export const DEMO_FABRIC_SHORT_SIZES = ['18', '20'];
/** The instruction step several testers of draft 2 find unclear (the fly front). */
export const DEMO_FLY_STEP = '14';
export const DEMO_DRAFT_NOTES = [
  'First draft for the fit round: print at home and sew a toile first.',
  'Rise lengthened by 3/4 in (19 mm) at centre back and 1/4 in (6 mm) at centre front; the back crotch curve is unchanged.',
];
/** Testers whose final report is still missing: the second tester of each of these sizes. */
const LATE_SIZES = ['2', '4', '6', '14', '16'];
/** Of them, these have saved part of the report without sending it. */
const STARTED_SIZES = ['2', '16'];
const VIEWS: FigureView[] = ['front', 'side', 'back'];

const DAY = 86_400_000;
const HOUR = 3_600_000;

type Tester = {
  enrollment: Enrollment;
  application: Application;
  user: User;
  size: PatternSize;
  sizeIndex: number;
  /** Place among the testers of the same size, by application order. */
  inSize: number;
  /** Place among all testers, smallest size first. */
  order: number;
  inseamDeltaMm: number | null;
};

type Alteration = NonNullable<ReportDraft['alterations']>[number];
type Fabric = NonNullable<ReportDraft['fabric']>;

/** Creates whatever of the demo drafts, reports and photos is missing; running it again changes nothing. */
export async function seedDemoReports(sequelize: Sequelize, options: { storage?: Storage } = {}): Promise<void> {
  const studio = await Studio.findOne({ where: { slug: DEMO_STUDIO.slug } });
  const trial = studio ? await Trial.findOne({ where: { studioId: studio.id, slug: DEMO_TRIAL_SLUG } }) : null;
  const pattern = trial ? await Pattern.findByPk(trial.patternId) : null;
  if (!studio || !trial || !pattern) return;

  const sizes = await PatternSize.findAll({ where: { patternId: pattern.id }, order: [['position', 'ASC']] });
  const needs = await FabricNeed.findAll({ where: { patternId: pattern.id } });
  const due = new Map((await Milestone.findAll({ where: { trialId: trial.id } })).map((m) => [m.kind as string, m.dueAt.getTime()]));
  const now = Date.now();
  const draftsOut = due.get('drafts-out') ?? now - 10 * DAY;
  const checkInDue = due.get('toile-check-in') ?? now - 4 * DAY;
  const secondDraftAt = Math.min(checkInDue + DAY, now - 2 * DAY);
  const testers = await loadTesters(trial, sizes);

  let opened: Storage | null = options.storage ?? null;
  const ownStorage = !options.storage;
  const storage = async () => (opened ??= await openDemoStorage());
  try {
    const designer = await User.findOne({ where: { email: 'designer@demo.basted.test' } });
    for (const version of [1, 2]) {
      if (await Draft.findOne({ where: { patternId: pattern.id, version } })) continue;
      const at = new Date(version === 1 ? draftsOut : secondDraftAt);
      const downloaders = version === 1 ? testers : testers.filter((t) => finalPlan(t) !== 'none');
      await seedDraft(sequelize, await storage(), { pattern, version, at, createdById: designer?.id ?? null, downloaders });
    }

    const created = await sequelize.transaction(async (transaction) => {
      let count = 0;
      for (const t of testers) {
        const held = new Set((await Report.findAll({ where: { enrollmentId: t.enrollment.id }, transaction })).map((r) => r.stage));
        if (!held.has('check-in')) {
          const submittedAt = new Date(Math.min(checkInDue - 6 * HOUR - t.order * 3 * HOUR, now - HOUR));
          await Report.create({ enrollmentId: t.enrollment.id, stage: 'check-in', content: checkInContent(t, needs), submittedAt }, { transaction });
          count += 1;
        }
        const plan = finalPlan(t);
        if (!held.has('final') && plan !== 'none') {
          const content = finalContent(t, needs);
          if (plan === 'submitted') {
            const submittedAt = new Date(Math.min(secondDraftAt + DAY + t.order * 2 * HOUR, now - HOUR));
            await Report.create({ enrollmentId: t.enrollment.id, stage: 'final', content, submittedAt }, { transaction });
            if (t.enrollment.status === 'active') await t.enrollment.update({ status: 'finished' }, { transaction });
          } else {
            // Saved half-way: size, draft and fit entered, nothing sent.
            const started: ReportDraft = { sizeSewn: content.sizeSewn, variantSewn: null, draftVersion: 2, fit: content.fit, alterations: [] };
            await Report.create({ enrollmentId: t.enrollment.id, stage: 'final', content: started, submittedAt: null }, { transaction });
          }
          count += 1;
        }
      }
      return count;
    });
    // As after a tester's submission: the stored findings follow the new reports.
    if (created > 0) await refreshFindingsQuietly(trial);

    // The grader has read draft 1: the short back rise was fixed in draft 2, the scoop (a grading
    // problem) and the waist of one size will be fixed next, the leg length is personal fit.
    const grader = await User.findOne({ where: { email: 'grader@demo.basted.test' } });
    if (grader && (await FindingTriage.count({ where: { trialId: trial.id } })) === 0) {
      await triageFinding(trial, grader, { kind: 'back-rise', direction: 'add', state: 'fixed', fixedInDraft: 2 });
      await triageFinding(trial, grader, { kind: 'crotch-curve-scoop', direction: 'add', state: 'will-fix' });
      await triageFinding(trial, grader, { kind: 'waist', direction: 'remove', state: 'will-fix' });
      await triageFinding(trial, grader, { kind: 'leg-length', direction: 'remove', state: 'personal-fit' });
      await triageFinding(trial, grader, { kind: 'leg-length', direction: 'add', state: 'personal-fit' });
      await addFindingNote(trial, grader, {
        kind: 'crotch-curve-scoop',
        direction: 'add',
        body: 'The back crotch curve needs more depth as the sizes grow: I will steepen the grade of the curve from size 12 up.',
      });
    }

    for (const t of photoTesters(testers)) {
      const fabric = finalContent(t, needs).fabric!;
      for (const view of VIEWS) {
        if (await Photo.count({ where: { enrollmentId: t.enrollment.id, stage: 'final', view } })) continue;
        const jpeg = await renderFigure({
          view,
          sizeLabel: t.size.label,
          sizeIndex: t.sizeIndex,
          colour: COLOURS[fabric.kind] ?? '#6b7048',
          caption: `Demo figure, draft 2, ${fabric.kind.toLowerCase()} (drawn, not a photo of a person)`,
        });
        // The same path as an upload from the tester's phone: content check, clean re-encode,
        // thumbnail, stored objects, then the row.
        await addPhoto(t.enrollment.id, t.user, { stage: 'final', view, consent: t.application.photoConsent }, { buffer: jpeg, name: `${view}.jpg` }, await storage());
      }
    }
  } finally {
    if (ownStorage) opened?.close();
  }
}

/** A Storage from the environment, as the server builds it; an unreachable store stops the seed with the reason. */
export async function openDemoStorage(env: Record<string, string | undefined> = process.env): Promise<Storage> {
  const config = loadConfig(env);
  const storage = createStorage(config.s3);
  try {
    await storage.check();
  } catch (error) {
    storage.close();
    const reason = error instanceof Error ? error.message || error.name : String(error);
    throw new Error(
      `the file store at ${config.s3.endpoint ?? 'the default S3 endpoint'} (buckets ${Object.values(config.s3.buckets).join(', ')}) ` +
        `cannot be reached (${reason}), so the demo drafts and photos cannot be stored. Start the local services ` +
        '(bash scripts/setup.sh --services) or set S3_ENDPOINT, then seed again.',
    );
  }
  return storage;
}

async function loadTesters(trial: Trial, sizes: PatternSize[]): Promise<Tester[]> {
  const enrollments = await Enrollment.findAll({
    where: { trialId: trial.id },
    include: [
      { model: Application, as: 'application' },
      { model: User, as: 'user' },
    ],
  });
  const position = new Map(sizes.map((s, i) => [s.id, i]));
  const rows = enrollments
    .map((enrollment) => {
      const e = enrollment as Enrollment & { application: Application; user: User };
      return { enrollment, application: e.application, user: e.user, sizeIndex: position.get(enrollment.sizeId) ?? -1 };
    })
    // A tester who left the trial sends nothing more.
    .filter((r) => r.sizeIndex >= 0 && r.enrollment.status !== 'dropped')
    .sort((a, b) => a.sizeIndex - b.sizeIndex || a.application.appliedAt.getTime() - b.application.appliedAt.getTime() || a.user.email.localeCompare(b.user.email));
  const seen = new Map<number, number>();
  return rows.map((r, order) => {
    const size = sizes[r.sizeIndex];
    const inSize = seen.get(r.sizeIndex) ?? 0;
    seen.set(r.sizeIndex, inSize + 1);
    const body = (r.application.profileSnapshot.measurementsMm ?? {}) as Record<string, number>;
    const chart = size.bodyMm as Record<string, number>;
    const inseamDeltaMm = typeof body.inseam === 'number' && typeof chart.inseam === 'number' ? body.inseam - chart.inseam : null;
    return { ...r, size, inSize, order, inseamDeltaMm };
  });
}

function finalPlan(t: Tester): 'submitted' | 'started' | 'none' {
  if (t.inSize !== 1 || !LATE_SIZES.includes(t.size.label)) return 'submitted';
  return STARTED_SIZES.includes(t.size.label) ? 'started' : 'none';
}

/** Two testers who share their photos and two who keep them for the studio: the smallest and largest sizes of each. */
function photoTesters(testers: Tester[]): Tester[] {
  const sent = testers.filter((t) => finalPlan(t) === 'submitted');
  const ends = (list: Tester[]) => (list.length > 2 ? [list[0], list[list.length - 1]] : list);
  const sharing = ends(sent.filter((t) => t.application.photoConsent === 'may-share'));
  const staffOnly = ends(sent.filter((t) => t.application.photoConsent === 'staff-only' && !sharing.some((x) => x.size.id === t.size.id)));
  return [...sharing, ...staffOnly];
}

// ---- What each tester reports -------------------------------------------------------------------

const COLOURS: Record<string, string> = {
  'Mid-weight linen': '#c9b79c',
  'Viscose twill': '#3d4a6b',
  'Peached tencel twill': '#6b7048',
  'Stretch cotton drill': '#a0522d',
};

/** The fabric a tester sews the finished pair in, from the fabric named in their application. */
function garmentFabric(t: Tester): Omit<Fabric, 'usedMm'> {
  // In the two largest sizes the legs do not fit across the narrow widths at all: those testers
  // sewed the wide drill, and still needed more than stated (the fabric finding).
  if (DEMO_FABRIC_SHORT_SIZES.includes(t.size.label)) return { kind: 'Stretch cotton drill', fibre: 'cotton, 2% elastane', widthMm: 1500, stretchPct: 3, napped: false };
  const planned = t.application.plannedFabric;
  if (/linen/i.test(planned)) return { kind: 'Mid-weight linen', fibre: 'linen', widthMm: 1500, stretchPct: 0, napped: false };
  if (/viscose/i.test(planned)) return { kind: 'Viscose twill', fibre: 'viscose', widthMm: 1140, stretchPct: 0, napped: false };
  // Peached (brushed) cloth has a nap, so it is cut with every piece the same way up.
  if (/tencel/i.test(planned)) return { kind: 'Peached tencel twill', fibre: 'lyocell', widthMm: 1140, stretchPct: 0, napped: true };
  return { kind: 'Stretch cotton drill', fibre: 'cotton, 2% elastane', widthMm: 1500, stretchPct: 3, napped: false };
}

/**
 * Length used: a little under the stated need in most sizes; in the two largest sizes the legs no
 * longer lie side by side across the width, so those testers need more than the pattern says.
 */
function usedLength(t: Tester, fabric: Omit<Fabric, 'usedMm'>, needs: FabricNeed[]): number {
  const candidates = needs.filter((n) => n.sizeId === t.size.id && n.napped === fabric.napped);
  const need = candidates.sort((a, b) => Math.abs(a.widthMm - (fabric.widthMm ?? 0)) - Math.abs(b.widthMm - (fabric.widthMm ?? 0)))[0];
  const stated = need?.lengthMm ?? 2500;
  const over = DEMO_FABRIC_SHORT_SIZES.includes(t.size.label);
  return Math.round(over ? stated + 180 + (t.order % 3) * 60 : stated - 80 - (t.order % 4) * 40);
}

function alteration(a: Omit<Alteration, 'otherText'>): Alteration {
  return { ...a, otherText: '' };
}

/**
 * Leg length by about the tester's own inseam difference from the chart, when that is 25 mm or
 * more: measured at home, rounded to 5 mm, give or take a little for the shoes they wear.
 */
function legAlteration(t: Tester): Alteration | null {
  const d = t.inseamDeltaMm;
  if (d === null || Math.abs(d) < 25) return null;
  const amountMm = Math.round((d + ((t.order * 7) % 11) - 5) / 5) * 5 || Math.sign(d) * 5;
  return alteration({
    area: 'leg',
    kind: 'leg-length',
    amountMm,
    where: 'both',
    note: amountMm < 0 ? `Took ${-amountMm} mm out at the shorten line: my inseam is shorter than the chart's.` : `Added ${amountMm} mm at the lengthen line; I am taller than the height the pattern is drafted for.`,
  });
}

/** Back crotch curve scooped in the larger sizes only, a little more at each size up. */
function scoopAlteration(t: Tester): Alteration | null {
  if (t.sizeIndex < 6) return null;
  const amountMm = 4 + (t.sizeIndex - 6) * 3 + (t.inSize % 2);
  return alteration({ area: 'rise', kind: 'crotch-curve-scoop', amountMm, where: 'back', note: 'Scooped the lowest part of the back crotch curve; the drag lines under the seat went.' });
}

/** The waist of the size-10 pieces is too big: every tester of that size takes it in. */
function waistAlteration(t: Tester): Alteration | null {
  if (t.size.label !== DEMO_WAIST_SIZE) return null;
  return alteration({ area: 'waist', kind: 'waist', amountMm: -(25 + (t.order % 3) * 4), where: 'back', note: 'Took the waist in at the centre back seam and waistband; it stood away from my back.' });
}

/** The rise of draft 1 is short everywhere: most testers add at the back crotch (15–20 mm). */
function riseAlteration(t: Tester): Alteration | null {
  // One tester in about seven finds it fine (short-waisted testers, as it happens).
  if (t.order % 7 === 3) return null;
  const amountMm = 15 + ((t.order * 5) % 6);
  return alteration({ area: 'rise', kind: 'back-rise', amountMm, where: 'back', note: 'Slashed and spread the back crotch at the hip line; the centre back was pulling down when I sat.' });
}

function fitFor(alterations: Alteration[]): NonNullable<ReportDraft['fit']> {
  const of = (kind: string) => alterations.find((a) => a.kind === kind)?.amountMm ?? 0;
  const rise = of('back-rise');
  const leg = of('leg-length');
  const waist = of('waist');
  // Lengthened or let out → it was short or tight (negative); shortened or taken in → long or loose.
  return {
    waist: waist === 0 ? 0 : Math.abs(waist) >= 28 ? 2 : 1,
    hip: 0,
    seat: of('crotch-curve-scoop') ? -1 : 0,
    rise: rise === 0 ? 0 : rise >= 18 ? -2 : -1,
    thigh: 0,
    leg: leg === 0 ? 0 : leg < 0 ? (leg <= -60 ? 2 : 1) : leg >= 60 ? -2 : -1,
  };
}

function checkInContent(t: Tester, needs: FabricNeed[]): ReportDraft {
  const alterations = [riseAlteration(t), scoopAlteration(t), legAlteration(t), waistAlteration(t)].filter((a): a is Alteration => a !== null);
  const toile: Omit<Fabric, 'usedMm'> = { kind: 'Calico (toile)', fibre: 'cotton', widthMm: 1500, stretchPct: 0, napped: false };
  const problems = [
    alterations.some((a) => a.kind === 'back-rise') ? 'the rise is short at the back' : null,
    alterations.some((a) => a.kind === 'crotch-curve-scoop') ? 'drag lines under the seat' : null,
    alterations.some((a) => a.kind === 'waist') ? 'the waist gapes' : null,
  ].filter(Boolean);
  return {
    sizeSewn: t.size.label,
    variantSewn: null,
    draftVersion: 1,
    fit: fitFor(alterations),
    alterations,
    fabric: { ...toile, usedMm: usedLength(t, toile, needs) },
    unclearSteps: t.order === 2 ? [{ step: '3', problem: 'Staystitching: which edges should be staystitched before the toile is sewn?' }] : [],
    verdict: problems.length ? `Toile sewn in calico: ${problems.join(', ')}. Otherwise close to a good fit.` : 'Toile sewn in calico: a good fit straight from the pattern.',
    wouldMakeAgain: null,
  };
}

function finalContent(t: Tester, needs: FabricNeed[]): ReportDraft {
  // Draft 2 fixed the rise; one tester still likes a little more at the back.
  const rise = t.order === 8 ? alteration({ area: 'rise', kind: 'back-rise', amountMm: 6, where: 'back', note: 'A touch more room at the back for cycling.' }) : null;
  const alterations = [rise, scoopAlteration(t), legAlteration(t), waistAlteration(t)].filter((a): a is Alteration => a !== null);
  const base = garmentFabric(t);
  const fly = t.application.experience === 'beginner' || t.order % 5 === 0;
  const unclearSteps = [
    ...(fly ? [{ step: DEMO_FLY_STEP, problem: 'Fly front: which way the zip faces and where to stop the topstitching was hard to follow.' }] : []),
    ...(t.order === 9 ? [{ step: '8', problem: 'Pocket bag: which bag piece does the pocket facing go on?' }] : []),
  ];
  const notes = [
    'The rise of draft 2 sits right.',
    alterations.some((a) => a.kind === 'crotch-curve-scoop') ? 'I still scooped the back crotch curve.' : null,
    alterations.some((a) => a.kind === 'waist') ? 'The waist needed taking in again.' : null,
    DEMO_FABRIC_SHORT_SIZES.includes(t.size.label) ? 'I needed more fabric than the pattern states.' : null,
  ].filter(Boolean);
  return {
    sizeSewn: t.size.label,
    variantSewn: null,
    draftVersion: 2,
    fit: fitFor(alterations),
    alterations,
    fabric: { ...base, usedMm: usedLength(t, base, needs) },
    unclearSteps,
    verdict: `${notes.join(' ')} ${t.order % 6 === 4 ? 'Not my style in the end.' : 'Comfortable and easy to wear.'}`,
    wouldMakeAgain: t.order % 6 !== 4,
  };
}

// ---- Draft files ---------------------------------------------------------------------------------

async function seedDraft(
  sequelize: Sequelize,
  storage: Storage,
  args: { pattern: Pattern; version: number; at: Date; createdById: string | null; downloaders: Tester[] },
) {
  const pdf = demoPdf([`${args.pattern.name} \u2014 draft ${args.version}`, 'Tern & Thimble (demo)', DEMO_DRAFT_NOTES[args.version - 1], 'An invented pattern for the Basted demo: no pattern pieces inside.']);
  const key = `drafts/${randomUUID()}.pdf`;
  await storage.put('drafts', key, pdf, 'application/pdf');
  try {
    await sequelize.transaction(async (transaction) => {
      const draft = await Draft.create(
        { patternId: args.pattern.id, version: args.version, changeNote: DEMO_DRAFT_NOTES[args.version - 1], createdById: args.createdById, createdAt: args.at },
        { transaction },
      );
      const file = await DraftFile.create(
        { draftId: draft.id, kind: 'print-a4', originalName: `wide-leg-trousers-demo-draft-${args.version}-a4.pdf`, objectKey: key, bytes: pdf.length, createdAt: args.at },
        { transaction },
      );
      // Each tester fetched the file within a day or so of its release.
      for (const t of args.downloaders) {
        await DraftDownload.create({ draftFileId: file.id, userId: t.user.id, createdAt: new Date(args.at.getTime() + HOUR + t.order * HOUR) }, { transaction });
      }
    });
  } catch (error) {
    await storage.remove('drafts', key).catch(() => undefined);
    throw error;
  }
}

/**
 * A one-page PDF with a few lines of text, written out by hand: header, catalog, page tree, one A4
 * page with a standard Type 1 font (Helvetica, which every reader has), the text as a content
 * stream, the cross-reference table with each object's byte offset, and the trailer (ISO 32000-1
 * §7.5 file structure, §9.6.2.2 standard fonts). Text is WinAnsi-encoded, so the em dash is byte 0x97.
 */
export function demoPdf(lines: string[]): Buffer {
  const winAnsi = (s: string) => s.replace(/\u2014/g, '\x97').replace(/[^\x20-\x7e\x97]/g, '?');
  const literal = (s: string) => `(${winAnsi(s).replace(/([\\()])/g, '\\$1')})`;
  const [title, ...rest] = lines;
  const stream = ['BT', '/F1 22 Tf', '72 760 Td', `${literal(title)} Tj`, '/F1 12 Tf', ...rest.flatMap((l) => ['0 -28 Td', `${literal(l)} Tj`]), 'ET'].join('\n');
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 4 0 R >> >> /Contents 5 0 R >>',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica /Encoding /WinAnsiEncoding >>',
    `<< /Length ${Buffer.byteLength(stream, 'latin1')} >>\nstream\n${stream}\nendstream`,
  ];
  return assemblePdf(objects);
}

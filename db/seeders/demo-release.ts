import { randomUUID } from 'node:crypto';
import type { Sequelize, Transaction } from 'sequelize';
import type { ReportDraft } from '../../server/domain/schemas/reports';
import { refreshFindings, triageFinding } from '../../server/findings/findings.service';
import { closingNoteMail, releaseThanksMail, rewardCodeMail } from '../../server/mail/release-templates';
import type { MailContent } from '../../server/mail/templates';
import type { Storage } from '../../server/storage/storage';
import {
  Application,
  Draft,
  DraftFile,
  Enrollment,
  Membership,
  Milestone,
  OutboxMessage,
  Pattern,
  PatternSize,
  Report,
  RewardCode,
  Studio,
  TesterProfile,
  Trial,
  User,
} from '../models';
import { loadConfig } from '../../server/config';
import { demoPdf, openDemoStorage } from './demo-reports';

/**
 * An earlier, released trial of the demo studio: a boxy woven top, tested two months before the
 * trousers by twenty-two people, most of whom came back to apply for the trousers (the studio's
 * pool of returning testers). Its draft 1 had a bodice too short in every size (whole draft),
 * draft 2 fixed it, draft 3 is the final pattern. Twenty finished; one stopped (excused) and one
 * withdrew. Every finisher got the thank-you with the final files and a reward code; the mail is
 * recorded as sent two months ago under the same keys a release uses, so nothing goes out again.
 * Everything is invented.
 */
export const DEMO_RELEASED_SLUG = 'boxy-top-demo';
export const DEMO_TOP_NAME = 'Boxy top (demo)';
const DAY = 86_400_000;
const IN = 25.4;
const SIZES = ['0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];
const BUST = [32, 33, 34, 35, 36, 37.5, 39, 40.5, 42, 44, 46];
const NOTES = [
  'First draft: a boxy woven top with a bateau neck and dropped shoulders.',
  'Bodice lengthened by 1 in (25 mm) at the hem in every size; hem facing widened.',
  'Final pattern: layered sizes, copy-shop and projector files, instructions.',
];
/** Who tested the top: the three demo testers and nineteen of the invented applicants. */
const TESTER_EMAILS = [
  'tester1@demo.basted.test',
  'tester2@demo.basted.test',
  'tester3@demo.basted.test',
  ...Array.from({ length: 19 }, (_, i) => `applicant${String(i + 1).padStart(2, '0')}@demo.basted.test`),
];
const EXCUSED = 'tester3@demo.basted.test';
const WITHDREW = 'applicant19@demo.basted.test';

/** Creates the released trial when it is missing (the file store is opened only then). */
export async function seedDemoReleasedTrial(sequelize: Sequelize): Promise<void> {
  if (await Trial.findOne({ where: { slug: DEMO_RELEASED_SLUG } })) return;
  let opened: Storage | null = null;
  try {
    await seedDemoRelease(sequelize, async () => (opened ??= await openDemoStorage()));
  } finally {
    (opened as Storage | null)?.close();
  }
}

export async function seedDemoRelease(sequelize: Sequelize, storage: () => Promise<Storage>): Promise<void> {
  const studio = await Studio.findOne({ where: { slug: 'tern-and-thimble' } });
  if (!studio || (await Trial.findOne({ where: { slug: DEMO_RELEASED_SLUG } }))) return;
  const now = Date.now();
  const at = (days: number) => new Date(now + days * DAY);
  const designer = await User.findOne({ where: { email: 'designer@demo.basted.test' } });
  const grader = await User.findOne({ where: { email: 'grader@demo.basted.test' } });

  // The files first (the store is outside the transaction): three drafts, one PDF each.
  const keys: string[] = [];
  for (const [i, note] of NOTES.entries()) {
    const key = `drafts/${randomUUID()}.pdf`;
    await (await storage()).put('drafts', key, demoPdf([`${DEMO_TOP_NAME} \u2014 draft ${i + 1}`, 'Tern & Thimble (demo)', note, 'An invented pattern for the Basted demo: no pattern pieces inside.']), 'application/pdf');
    keys.push(key);
  }

  const trialId = await sequelize.transaction(async (transaction) => {
    const pattern = await Pattern.create(
      {
        studioId: studio.id,
        name: DEMO_TOP_NAME,
        category: 'top',
        fabricKind: 'woven',
        notes: 'Boxy, cropped to the high hip, bateau neck, dropped shoulders. Drafted in size 10.',
        draftedHeightMm: 66 * IN,
        bodyColumns: ['bust', 'waist', 'hip'],
        finishedColumns: ['bust', 'hip'],
      },
      { transaction },
    );
    const sizes: PatternSize[] = [];
    for (const [position, label] of SIZES.entries()) {
      const bust = BUST[position];
      sizes.push(await PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { bust: bust * IN, waist: (bust - 7) * IN, hip: (bust + 2) * IN }, finishedMm: { bust: (bust + 8) * IN, hip: (bust + 8) * IN } }, { transaction }));
    }
    const drafts: Draft[] = [];
    for (const [i, note] of NOTES.entries()) {
      const created = at(-120 + i * 25);
      const draft = await Draft.create({ patternId: pattern.id, version: i + 1, changeNote: note, createdById: designer?.id ?? null, createdAt: created }, { transaction });
      await DraftFile.create({ draftId: draft.id, kind: 'print-a4', originalName: `boxy-top-demo-draft-${i + 1}-a4.pdf`, objectKey: keys[i], bytes: 900, createdAt: created }, { transaction });
      drafts.push(draft);
    }
    const trial = await Trial.create(
      {
        studioId: studio.id,
        patternId: pattern.id,
        slug: DEMO_RELEASED_SLUG,
        title: 'Boxy top: fit round (demo)',
        callText: 'Our boxy woven top, sizes 0 to 20: we are looking for two testers per size.',
        requirements: 'A light woven (linen, cotton lawn, viscose). A toile check-in and a final report with photos.',
        state: 'closed',
        coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 2 })), heightBands: [], variants: [] },
        finalDraftId: drafts[2].id,
        coverageGapNote: 'Sizes 4 and 20 have one finisher each; both agree with their neighbouring sizes, so no new testers were sought.',
        createdAt: at(-150),
      },
      { transaction },
    );
    for (const [kind, days] of [['applications-close', -135], ['selection', -130], ['drafts-out', -120], ['toile-check-in', -100], ['final-report', -75], ['release', -62]] as const) {
      await Milestone.create({ trialId: trial.id, kind, dueAt: at(days) }, { transaction });
    }
    await enrolTesters(trial, sizes, at, transaction);
    return trial.id;
  });

  const trial = (await Trial.findByPk(trialId))!;
  await refreshFindings(trial);
  if (grader) await triageFinding(trial, grader, { kind: 'bodice-length', direction: 'add', state: 'fixed', fixedInDraft: 2 });
  await recordRelease(trial, at(-60), designer);
}

async function enrolTesters(trial: Trial, sizes: PatternSize[], at: (days: number) => Date, transaction: Transaction) {
  for (const [i, email] of TESTER_EMAILS.entries()) {
    const user = await User.findOne({ where: { email }, transaction });
    if (!user) continue;
    const size = sizes[i % sizes.length];
    const profile = await TesterProfile.findByPk(user.id, { transaction });
    const measurementsMm = profile?.measurementsMm ?? { bust: (size.bodyMm.bust ?? 900) + 10, height: 1560 + ((i * 37) % 280) };
    const withdrew = email === WITHDREW;
    const app = await Application.create(
      {
        trialId: trial.id,
        userId: user.id,
        sizeId: size.id,
        variantId: null,
        profileSnapshot: { name: user.name, email: user.email, measurementsMm },
        adviceSnapshot: null,
        plannedFabric: ['Linen', 'Cotton lawn', 'Viscose challis'][i % 3],
        experience: ['beginner', 'confident', 'advanced'][i % 3],
        photoConsent: i % 3 === 0 ? 'may-share' : 'staff-only',
        status: withdrew ? 'withdrawn' : 'selected',
        appliedAt: at(-140 + (i % 5)),
        decidedAt: at(-130),
      },
      { transaction },
    );
    const enrollment = await Enrollment.create(
      {
        trialId: trial.id,
        applicationId: app.id,
        userId: user.id,
        sizeId: size.id,
        variantId: null,
        status: withdrew ? 'dropped' : email === EXCUSED ? 'active' : 'finished',
        excusedAt: email === EXCUSED ? at(-70) : null,
        excuseNote: email === EXCUSED ? 'Could not finish: family matters. Sent a good check-in.' : null,
        createdAt: at(-130),
      },
      { transaction },
    );
    await Membership.findOrCreate({ where: { studioId: trial.studioId, userId: user.id }, defaults: { studioId: trial.studioId, userId: user.id, role: 'tester' }, transaction });
    if (withdrew) continue;
    // Draft 1's bodice was short for nearly everyone; draft 2 fixed it.
    const short = i % 7 !== 3;
    const checkIn: ReportDraft = {
      sizeSewn: size.label,
      draftVersion: 1,
      fit: { length: short ? -1 : 0, bust: 0, shoulder: 0 },
      alterations: short ? [{ area: 'length', kind: 'bodice-length', amountMm: (0.75 + (i % 3) * 0.25) * IN, where: 'both', note: '', otherText: '' }] : [],
      verdict: short ? 'Lovely shape, but it stops above my waist: I added length at the hem.' : 'Fits as drawn.',
    };
    await Report.create({ enrollmentId: enrollment.id, stage: 'check-in', content: checkIn, submittedAt: at(-101 - (i % 4)) }, { transaction });
    if (email === EXCUSED) continue;
    const final: ReportDraft = {
      sizeSewn: size.label,
      draftVersion: 2,
      fit: { length: 0, bust: 0, shoulder: i % 5 === 0 ? 1 : 0 },
      alterations: i % 9 === 4 ? [{ area: 'bust', kind: 'bust', amountMm: 0.5 * IN, where: 'front', note: 'Small full-bust adjustment, as I always do.', otherText: '' }] : [],
      fabric: { kind: ['Linen', 'Cotton lawn', 'Viscose challis'][i % 3], fibre: ['Linen', 'Cotton', 'Viscose'][i % 3], widthMm: 1450, usedMm: 1300 + (i % 5) * 50, stretchPct: null, napped: false },
      verdict: 'Sewn in a weekend; I will make another.',
      wouldMakeAgain: true,
    };
    await Report.create({ enrollmentId: enrollment.id, stage: 'final', content: final, submittedAt: at(-76 - (i % 5)) }, { transaction });
  }
}

/** The release as it happened: reward codes given, and the mail recorded as sent under a release's own keys. */
async function recordRelease(trial: Trial, releasedAt: Date, designer: User | null) {
  const studio = (await Studio.findByPk(trial.studioId))!;
  const enrollments = (await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: User, as: 'user' }], order: [['createdAt', 'ASC'], ['id', 'ASC']] })) as (Enrollment & { user: User })[];
  const link = `${loadConfig().publicUrl}/my-trials`;
  const finishers = enrollments.filter((e) => e.status === 'finished');
  await trial.update({ releasedAt, releasedById: designer?.id ?? null, releaseOpenItems: [] });
  const codes = Array.from({ length: finishers.length + 2 }, (_, i) => `TERN-BOXY-${String(i + 1).padStart(3, '0')}`);
  await RewardCode.bulkCreate(codes.map((code, i) => ({ trialId: trial.id, code, enrollmentId: finishers[i]?.id ?? null, assignedAt: finishers[i] ? releasedAt : null })));
  const sent = async (key: string, e: Enrollment & { user: User }, template: string, content: MailContent) =>
    OutboxMessage.create({
      idempotencyKey: key,
      recipientId: e.user.id,
      recipientEmail: e.user.email,
      template,
      category: 'trial-news',
      studioId: trial.studioId,
      trialId: trial.id,
      enrollmentId: e.id,
      subject: content.subject,
      text: content.text,
      html: content.html,
      status: 'sent',
      attempts: 1,
      nextAttemptAt: releasedAt,
      sentAt: releasedAt,
      createdAt: releasedAt,
    });
  for (const e of enrollments) {
    const base = { name: e.user.name, trialTitle: trial.title, studioName: studio.name, link };
    if (e.status === 'finished') {
      await sent(`release-thanks:${trial.id}:${e.id}`, e, 'release-thanks', releaseThanksMail({ ...base, finalVersion: 3, fileCount: 1 }));
      await sent(`reward-code:${e.id}`, e, 'reward-code', rewardCodeMail({ ...base, code: codes[finishers.indexOf(e)] }));
    } else {
      await sent(`release-closing:${trial.id}:${e.id}`, e, 'release-closing', closingNoteMail(base));
    }
  }
}

import { randomUUID } from 'node:crypto';
import { Draft, DraftFile, Milestone, Pattern, PatternSize, Report, Studio, Trial, type Enrollment, type User } from '../../db/models';
import { refreshFindings } from '../../server/findings/findings.service';
import type { Storage } from '../../server/storage/storage';
import { addMember, createUser, enrolTester } from './factories';
import { tinyPdf } from './sample-files';

const IN = 25.4;

export type ReleaseWorld = {
  studio: Studio;
  owner: User;
  coordinator: User;
  grader: User;
  pattern: Pattern;
  sizes: PatternSize[];
  trial: Trial;
  draft1: Draft;
  /** Eight testers who sent a final report on draft 1 (status finished)… */
  finishers: { user: User; enrollment: Enrollment }[];
  /** …and one in size 12 who did not. */
  straggler: { user: User; enrollment: Enrollment };
};

/**
 * A running trousers trial ready to be closed: sizes 8, 10 and 12, three testers wanted in each;
 * nine enrolled, eight of whom sent their final report on draft 1 and finished; seven of the eight
 * lengthened the back crotch by 3/4 in, a whole-draft finding. Size 12 has only two finishers
 * (the ninth tester never reported). Draft 1 has one PDF file, stored in the file store.
 */
export async function createReleaseWorld(storage: Storage, label = 'Quay'): Promise<ReleaseWorld> {
  const studio = await Studio.create({ name: `${label} Studio`, slug: `release-${randomUUID()}`, timeZone: 'Europe/Lisbon' });
  const [owner, coordinator, grader] = [await createUser(`${label.toLowerCase()}-owner`), await createUser(`${label.toLowerCase()}-coordinator`), await createUser(`${label.toLowerCase()}-grader`)];
  await addMember(studio, owner, 'owner');
  await addMember(studio, coordinator, 'coordinator');
  await addMember(studio, grader, 'grader');
  const pattern = await Pattern.create({ studioId: studio.id, name: `${label} trousers`, category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip', 'inseam'] });
  const sizes = await Promise.all(
    ['8', '10', '12'].map((l, position) => PatternSize.create({ patternId: pattern.id, label: l, position, bodyMm: { hip: (37 + 1.5 * position) * IN, inseam: 30 * IN } })),
  );
  const trial = await Trial.create({
    studioId: studio.id,
    patternId: pattern.id,
    slug: `${label.toLowerCase()}-${randomUUID().slice(0, 8)}`,
    title: `${label} trousers, first round`,
    callText: 'Testers wanted for wide trousers.',
    requirements: 'A drapey woven.',
    state: 'running',
    coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 3 })), heightBands: [], variants: [] },
  });
  const now = Date.now();
  const day = 86_400_000;
  for (const [kind, offset] of [['applications-close', -30], ['toile-check-in', -10], ['final-report', 3], ['release', 20]] as const) {
    await Milestone.create({ trialId: trial.id, kind, dueAt: new Date(now + offset * day) });
  }
  const key = `drafts/${randomUUID()}.pdf`;
  await storage.put('drafts', key, tinyPdf(), 'application/pdf');
  const draft1 = await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First draft', createdById: owner.id });
  await DraftFile.create({ draftId: draft1.id, kind: 'print-a4', originalName: `${label.toLowerCase()}-draft-1-a4.pdf`, objectKey: key, bytes: tinyPdf().length });

  const finishers: ReleaseWorld['finishers'] = [];
  let straggler: ReleaseWorld['straggler'] | null = null;
  for (let i = 0; i < 9; i += 1) {
    const user = await createUser(`${label.toLowerCase()}-tester-${i}`, { name: `${label} Tester ${i + 1}` });
    await addMember(studio, user, 'tester');
    const size = sizes[i % 3];
    const { enrollment } = await enrolTester(trial.id, user.id, size.id, { profileSnapshot: { measurementsMm: { hip: (37 + 1.5 * (i % 3)) * IN + 10, inseam: 30 * IN, height: 1550 + i * 40 } } });
    if (i === 8) {
      straggler = { user, enrollment };
      continue;
    }
    const alterations = i < 7 ? [{ area: 'rise' as const, kind: 'back-rise', amountMm: 0.75 * IN, where: 'back' as const, note: '', otherText: '' }] : [];
    await Report.create({
      enrollmentId: enrollment.id,
      stage: 'final',
      submittedAt: new Date(now - day),
      content: { sizeSewn: size.label, draftVersion: 1, fit: { rise: -1 }, alterations, verdict: 'Short in the back rise.' },
    });
    await enrollment.update({ status: 'finished' });
    finishers.push({ user, enrollment });
  }
  await refreshFindings(trial);
  return { studio, owner, coordinator, grader, pattern, sizes, trial, draft1, finishers, straggler: straggler! };
}

/** Draft 2 of the world's pattern with one stored PDF: the later draft the "will fix" findings need. */
export async function addDraft(world: ReleaseWorld, storage: Storage, version: number, changeNote: string) {
  const key = `drafts/${randomUUID()}.pdf`;
  await storage.put('drafts', key, tinyPdf(), 'application/pdf');
  const draft = await Draft.create({ patternId: world.pattern.id, version, changeNote, createdById: world.owner.id });
  const file = await DraftFile.create({ draftId: draft.id, kind: 'print-a4', originalName: `draft-${version}-a4.pdf`, objectKey: key, bytes: tinyPdf().length });
  return { draft, file };
}

import { Zip, ZipDeflate, ZipPassThrough } from 'fflate';
import {
  Announcement,
  AnnouncementRecipient,
  Application,
  CalendarFeed,
  Draft,
  DraftDownload,
  DraftFile,
  Enrollment,
  Membership,
  OutboxMessage,
  Pattern,
  PatternSize,
  PatternVariant,
  Photo,
  Report,
  RewardCode,
  Studio,
  TesterProfile,
  Trial,
  type User,
} from '../../db/models';
import type { Storage } from '../storage/storage';
import { readObject } from '../storage/read-object';

const README = `Everything Basted holds about you, as of the date in profile.json.

profile.json        your account, your body profile (lengths in millimetres) and the studios you belong to
applications.json   each application with the profile and size advice copied into it when you applied,
                    and your place in the trial (enrolment, dates the studio gave you)
reports.json        your check-ins and final reports, as saved
photos.json         your photos (the files are in photos/), with who you allowed to see each
messages.json       the e-mails Basted sent you or decided not to send
announcements.json  messages studios sent to testers of your trials
rewards.json        reward codes studios gave you
downloads.json      the draft files you fetched
calendar.json       whether you have a private calendar feed
`;

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** Everything held about one person, as plain records (photos listed; their bytes come separately). */
export async function exportRecords(user: User) {
  const profile = await TesterProfile.findByPk(user.id);
  const memberships = await Membership.findAll({ where: { userId: user.id }, include: [{ model: Studio, as: 'studio' }] });
  const applications = await Application.findAll({
    where: { userId: user.id },
    include: [{ model: Trial, as: 'trial', include: [{ model: Pattern, as: 'pattern' }] }],
    order: [['appliedAt', 'ASC']],
  });
  const studios = new Map((await Studio.findAll({ where: { id: [...new Set(applications.map((a) => a.trial!.studioId))] } })).map((s) => [s.id, s.name]));
  const enrollments = await Enrollment.findAll({ where: { userId: user.id } });
  const enrollmentIds = enrollments.map((e) => e.id);
  const sizeIds = [...new Set([...applications.map((a) => a.sizeId), ...enrollments.map((e) => e.sizeId)].filter((s): s is string => Boolean(s)))];
  const sizes = new Map((await PatternSize.findAll({ where: { id: sizeIds } })).map((s) => [s.id, s.label]));
  const variantIds = [...new Set(applications.map((a) => a.variantId).filter((v): v is string => Boolean(v)))];
  const variants = new Map((await PatternVariant.findAll({ where: { id: variantIds } })).map((v) => [v.id, v.name]));
  const trialTitle = new Map(applications.map((a) => [a.trialId, a.trial!.title]));
  const trialOfEnrollment = new Map(enrollments.map((e) => [e.id, e.trialId]));
  const reports = await Report.findAll({ where: { enrollmentId: enrollmentIds }, order: [['createdAt', 'ASC']] });
  const photos = await Photo.findAll({ where: { enrollmentId: enrollmentIds }, order: [['createdAt', 'ASC']] });
  const messages = await OutboxMessage.findAll({ where: { recipientId: user.id }, order: [['createdAt', 'ASC']] });
  const received = await AnnouncementRecipient.findAll({ where: { userId: user.id } });
  const announcements = await Announcement.findAll({ where: { id: received.map((r) => r.announcementId) }, order: [['createdAt', 'ASC']] });
  const rewards = await RewardCode.findAll({ where: { enrollmentId: enrollmentIds } });
  const downloads = await DraftDownload.findAll({
    where: { userId: user.id },
    include: [{ model: DraftFile, as: 'file', include: [{ model: Draft, as: 'draft', include: [{ model: Pattern, as: 'pattern' }] }] }],
    order: [['createdAt', 'ASC']],
  });
  const feed = await CalendarFeed.findOne({ where: { userId: user.id } });

  const photoFile = (p: Photo) => {
    const trial = trialOfEnrollment.get(p.enrollmentId);
    const slug = applications.find((a) => a.trialId === trial)?.trial?.slug ?? 'trial';
    return `photos/${slug}/${p.stage}-${p.view}-${p.id.slice(0, 8)}.jpg`;
  };
  return {
    profile: {
      exportedAt: new Date().toISOString(),
      account: {
        name: user.name,
        email: user.email,
        lengthUnit: user.lengthUnit,
        fabricUnit: user.fabricUnit,
        timeZone: user.timeZone,
        mail: { reminders: user.mailReminders, trialNews: user.mailTrialNews, digest: user.mailDigest },
        createdAt: iso(user.createdAt),
      },
      body: profile ? { measurementsMm: profile.measurementsMm, experience: profile.experience, fitNotes: profile.fitNotes, updatedAt: iso(profile.updatedAt) } : null,
      studios: memberships.map((m) => ({ studio: m.studio?.name ?? '', role: m.role, since: iso(m.createdAt) })),
    },
    applications: applications.map((a) => {
      const e = enrollments.find((x) => x.applicationId === a.id);
      return {
        trial: a.trial!.title,
        studio: studios.get(a.trial!.studioId) ?? '',
        pattern: a.trial!.pattern?.name ?? '',
        status: a.status,
        appliedAt: iso(a.appliedAt),
        decidedAt: iso(a.decidedAt),
        size: a.sizeId ? (sizes.get(a.sizeId) ?? null) : null,
        variant: a.variantId ? (variants.get(a.variantId) ?? null) : null,
        plannedFabric: a.plannedFabric,
        experience: a.experience,
        photoConsent: a.photoConsent,
        note: a.note,
        decisionReason: a.decisionReason,
        profileAsApplied: a.profileSnapshot,
        sizeAdviceAsApplied: a.adviceSnapshot,
        enrolment: e
          ? { status: e.status, size: sizes.get(e.sizeId) ?? null, datesGiven: e.dueOverrides, excusedAt: iso(e.excusedAt), excuseNote: e.excuseNote }
          : null,
      };
    }),
    reports: reports.map((r) => ({
      trial: trialTitle.get(trialOfEnrollment.get(r.enrollmentId) ?? '') ?? '',
      stage: r.stage,
      submittedAt: iso(r.submittedAt),
      createdAt: iso(r.createdAt),
      updatedAt: iso(r.updatedAt),
      content: r.content,
    })),
    photos: photos.map((p) => ({
      file: photoFile(p),
      trial: trialTitle.get(trialOfEnrollment.get(p.enrollmentId) ?? '') ?? '',
      stage: p.stage,
      view: p.view,
      whoMaySee: p.consent === 'may-share' ? 'the studio may share it' : 'the studio’s staff only',
      width: p.width,
      height: p.height,
      takenInto: iso(p.createdAt),
    })),
    photoObjects: photos.map((p) => ({ file: photoFile(p), key: p.fullKey })),
    messages: messages.map((m) => ({ subject: m.subject, kind: m.template, status: m.status, sentAt: iso(m.sentAt), createdAt: iso(m.createdAt), text: m.text })),
    announcements: announcements.map((a) => ({ trial: trialTitle.get(a.trialId) ?? '', subject: a.subject, body: a.body, sentAt: iso(a.createdAt) })),
    rewards: rewards.map((r) => ({ trial: trialTitle.get(trialOfEnrollment.get(r.enrollmentId ?? '') ?? '') ?? '', code: r.code, givenAt: iso(r.assignedAt) })),
    downloads: downloads.map((d) => {
      const file = (d as DraftDownload & { file?: DraftFile & { draft?: Draft & { pattern?: Pattern } } }).file;
      return { pattern: file?.draft?.pattern?.name ?? '', draft: file?.draft?.version ?? null, file: file?.originalName ?? '', at: iso(d.createdAt) };
    }),
    calendar: { privateFeed: Boolean(feed), since: iso(feed?.createdAt) },
  };
}

/**
 * The export as a ZIP of JSON files and the photos at full size, streamed out piece by piece (one
 * photo in memory at a time). JPEGs are stored as they are; the JSON is compressed.
 */
export async function writeExportZip(user: User, storage: Storage, write: (chunk: Uint8Array) => void): Promise<void> {
  const records = await exportRecords(user);
  let failed: Error | null = null;
  const finished = new Promise<void>((resolve, reject) => {
    const zip = new Zip((error, chunk, final) => {
      if (error) {
        failed = error;
        reject(error);
        return;
      }
      write(chunk);
      if (final) resolve();
    });
    const addText = (name: string, text: string) => {
      const file = new ZipDeflate(name, { level: 6 });
      zip.add(file);
      file.push(new TextEncoder().encode(text), true);
    };
    const { photoObjects, ...json } = records;
    (async () => {
      addText('README.txt', README);
      for (const [name, value] of Object.entries(json)) addText(`${name}.json`, `${JSON.stringify(value, null, 2)}\n`);
      const unread: string[] = [];
      for (const p of photoObjects) {
        let bytes: Buffer;
        try {
          bytes = await readObject(storage, 'photos', p.key);
        } catch {
          // The archive still goes out; it says which photo could not be read just now.
          unread.push(p.file);
          continue;
        }
        const file = new ZipPassThrough(p.file);
        zip.add(file);
        file.push(bytes, true);
      }
      if (unread.length) addText('photos-not-included.txt', `The file store did not give these photos just now; ask for the export again later:\n${unread.join('\n')}\n`);
      zip.end();
    })().catch((error: unknown) => {
      failed = error as Error;
      zip.terminate();
      reject(error);
    });
  });
  await finished;
  if (failed) throw failed;
}

import Papa from 'papaparse';
import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import { Enrollment, OutboxMessage, RewardCode, Studio, type Trial, User } from '../../db/models';
import type { Config } from '../config';
import { badRequest } from '../errors';
import type { Mailer } from '../mail/mailer';
import { rewardCodeMail } from '../mail/release-templates';
import { optOutFor, send as sendMail } from '../outbox/outbox.service';

const MAX_CODE = 200;
// Letters, digits and the punctuation codes use; no spaces or control characters.
const CODE_SHAPE = /^[\p{L}\p{N}\-_.:#/+=@!$%*]+$/u;

/**
 * Reads a CSV of reward codes: one column of codes, or a column headed "code" among others. The
 * whole file is refused, with each problem named by row, when any code is empty, too long,
 * oddly shaped, repeated in the file or already imported for this trial; nothing is saved then.
 */
export function parseRewardCodes(csv: string, existing: ReadonlySet<string>): string[] {
  // Blank lines are kept while reading so each problem names the line a person sees in the file.
  const parsed = Papa.parse<string[]>(csv.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const lines = parsed.data.map((r, i) => ({ line: i + 1, cells: r.map((c) => c.trim()) })).filter((r) => r.cells.some(Boolean));
  if (lines.length === 0) throw badRequest('The file has no codes.', { csv: 'no codes in the file' });
  const rows = lines.map((l) => l.cells);
  const header = rows[0].map((c) => c.toLowerCase());
  let column = 0;
  let start = 0;
  if (header.includes('code')) {
    column = header.indexOf('code');
    start = 1;
  } else if (rows[0].length > 1) {
    throw badRequest('The file has several columns: head the column of codes “code”.', { csv: 'no column headed “code”' });
  }
  const fields: Record<string, string> = {};
  const seen = new Map<string, number>();
  const codes: string[] = [];
  rows.slice(start).forEach((row, i) => {
    const line = lines[i + start].line;
    const code = row[column] ?? '';
    if (!code) fields[`row ${line}`] = 'has no code';
    else if (code.length > MAX_CODE) fields[`row ${line}`] = `is longer than ${MAX_CODE} characters`;
    else if (!CODE_SHAPE.test(code)) fields[`row ${line}`] = 'has spaces or characters a code cannot have';
    else if (seen.has(code)) fields[`row ${line}`] = `repeats the code of row ${seen.get(code)}`;
    else if (existing.has(code)) fields[`row ${line}`] = 'is imported for this trial already';
    else {
      seen.set(code, line);
      codes.push(code);
    }
  });
  if (Object.keys(fields).length) throw badRequest('Some codes cannot be used; nothing was imported.', fields);
  if (codes.length === 0) throw badRequest('The file has no codes.', { csv: 'no codes in the file' });
  return codes;
}

export async function importRewardCodes(trial: Trial, csv: string) {
  const existing = new Set((await RewardCode.findAll({ where: { trialId: trial.id }, attributes: ['code'] })).map((c) => c.code));
  const codes = parseRewardCodes(csv, existing);
  try {
    await RewardCode.sequelize!.transaction(async (transaction) => {
      await RewardCode.bulkCreate(
        codes.map((code) => ({ trialId: trial.id, code })),
        { transaction },
      );
    });
  } catch (error) {
    // Two imports of the same file at once: the unique key answers for the second.
    if (error instanceof UniqueConstraintError) throw badRequest('Some of these codes were imported at the same moment; nothing more was imported.', { csv: 'imported already' });
    throw error;
  }
  return { added: codes.length, ...(await rewardCodeCounts(trial)) };
}

export async function rewardCodeCounts(trial: Trial) {
  const total = await RewardCode.count({ where: { trialId: trial.id } });
  const assigned = await RewardCode.count({ where: { trialId: trial.id, enrollmentId: { [Op.ne]: null } } });
  return { total, assigned, unassigned: total - assigned };
}

/** The codes with whom each went to and what became of its e-mail. */
export async function listRewardCodes(trial: Trial) {
  const codes = await RewardCode.findAll({ where: { trialId: trial.id }, order: [['createdAt', 'ASC'], ['code', 'ASC']] });
  const enrollments = await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: User, as: 'user' }] });
  const messages = await OutboxMessage.findAll({ where: { trialId: trial.id, template: 'reward-code' } });
  const finishers = enrollments.filter((e) => e.status === 'finished').length;
  return {
    released: Boolean(trial.releasedAt),
    finishers,
    ...(await rewardCodeCounts(trial)),
    codes: codes.map((c) => {
      const e = enrollments.find((x) => x.id === c.enrollmentId) as (Enrollment & { user?: User }) | undefined;
      const mail = messages.find((m) => m.enrollmentId === c.enrollmentId);
      return { id: c.id, code: c.code, tester: e ? (e.user?.deletedAt ? 'A former tester' : (e.user?.name ?? null)) : null, assignedAt: c.assignedAt, mail: mail ? { status: mail.status, sentAt: mail.sentAt } : null };
    }),
  };
}

/**
 * Gives each finisher of a released trial one code (the unique key on the enrolment keeps it to
 * one, even with two processes at once: a code is claimed under SKIP LOCKED) and sends it once
 * (the outbox key is the enrolment's). Codes wait until the trial is released.
 */
export async function assignAndSendRewardCodes(trial: Trial, deps: { config: Config; mailer: Mailer }) {
  if (!trial.releasedAt) return { assigned: 0, sent: 0, missing: 0 };
  const sequelize = RewardCode.sequelize!;
  const finishers = (await Enrollment.findAll({ where: { trialId: trial.id, status: 'finished' }, include: [{ model: User, as: 'user' }], order: [['createdAt', 'ASC']] })) as (Enrollment & { user?: User })[];
  let assigned = 0;
  let missing = 0;
  for (const e of finishers) {
    if (!e.user || e.user.deletedAt) continue;
    if (await RewardCode.count({ where: { enrollmentId: e.id } })) continue;
    try {
      const claimed = await sequelize.transaction(async (transaction) => {
        const [row] = await sequelize.query<{ id: string }>(
          `UPDATE reward_codes SET enrollment_id = $1, assigned_at = now(), updated_at = now()
           WHERE id = (SELECT id FROM reward_codes WHERE trial_id = $2 AND enrollment_id IS NULL ORDER BY created_at, code LIMIT 1 FOR UPDATE SKIP LOCKED)
           RETURNING id`,
          { bind: [e.id, trial.id], type: QueryTypes.SELECT, transaction },
        );
        return row ?? null;
      });
      if (claimed) assigned += 1;
      else missing += 1;
    } catch (error) {
      // Another process gave this finisher a code a moment ago: theirs stands.
      if (!(error instanceof UniqueConstraintError) && !String((error as Error).message).includes('reward_codes_enrollment_id')) throw error;
    }
  }
  const studio = (await Studio.findByPk(trial.studioId))!;
  let sent = 0;
  for (const code of await RewardCode.findAll({ where: { trialId: trial.id } })) {
    const e = finishers.find((f) => f.id === code.enrollmentId);
    if (!e?.user || e.user.deletedAt) continue;
    const row = await sendMail(deps, {
      key: `reward-code:${e.id}`,
      to: { id: e.user.id, email: e.user.email },
      template: 'reward-code',
      category: 'trial-news',
      studioId: trial.studioId,
      trialId: trial.id,
      enrollmentId: e.id,
      content: rewardCodeMail({
        name: e.user.name,
        trialTitle: trial.title,
        studioName: studio.name,
        link: `${deps.config.publicUrl}/my-trials`,
        code: code.code,
        optOut: optOutFor(deps.config, e.user.id, 'trial-news'),
      }),
    });
    if (row) sent += 1;
  }
  return { assigned, sent, missing };
}

import { literal, Op } from 'sequelize';
import { Application, Enrollment, Trial, User } from '../../db/models';
import type { Cursor } from '../pagination';

/** `(column, id) > (cursor)` on the page index's order, with the cursor's values escaped. */
function after(column: string, model: string, cursor: Cursor | null) {
  if (!cursor) return [];
  const s = Trial.sequelize!;
  return [literal(`("${model}"."${column}", "${model}"."id") > (${s.escape(cursor.at)}::timestamptz, ${s.escape(cursor.id)}::uuid)`)];
}

/** One page of a trial's applications in the order they came (the index applications_trial_page). */
export async function applicationsPage(trialId: string, limit: number, cursor: Cursor | null) {
  const rows = await Application.findAll({
    where: { trialId, [Op.and]: after('applied_at', 'Application', cursor) },
    include: [{ model: User, as: 'user', attributes: ['id', 'name', 'email'] }],
    order: [['appliedAt', 'ASC'], ['id', 'ASC']],
    limit: limit + 1,
  });
  const page = rows.slice(0, limit);
  const last = page[page.length - 1];
  return { rows: page, next: rows.length > limit && last ? { at: last.appliedAt.toISOString(), id: last.id } : null };
}

/** One page of a trial's enrolments in the order they were made (the index enrollments_trial_page). */
export async function enrollmentsPage(trialId: string, limit: number, cursor: Cursor | null) {
  const rows = await Enrollment.findAll({
    where: { trialId, [Op.and]: after('created_at', 'Enrollment', cursor) },
    include: [{ model: User, as: 'user', attributes: ['id', 'name'] }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
    limit: limit + 1,
  });
  const page = rows.slice(0, limit);
  const last = page[page.length - 1];
  return { rows: page, next: rows.length > limit && last ? { at: last.createdAt.toISOString(), id: last.id } : null };
}

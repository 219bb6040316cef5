import { Router, type Request, type Response } from 'express';
import { Enrollment, Milestone, Report, User } from '../../db/models';
import type { AppDeps } from '../app';
import { requireStudio } from '../auth/guards';
import { TESTER_MILESTONES } from '../domain/trials';
import { badRequest } from '../errors';
import { REMINDING_TRIAL_STATES, STAGE_OF, dueFor } from '../jobs/reminder-state';
import { WHAT_IS_DUE } from '../jobs/reminders';
import { upcomingReminders } from '../jobs/schedule';
import { OPTIONAL_KINDS, readOptOutToken } from '../mail/opt-out';
import { uuidParam } from '../middleware/uuid-param';
import { loadTrial } from '../trials/trials.service';
import { resend, serializeOutboxMessage, trialOutbox } from './outbox.service';

/** The reminders still ahead for the trial's active testers, as the sweep will send them. */
async function plannedReminders(trialId: string, state: string, now: Date) {
  if (!(REMINDING_TRIAL_STATES as readonly string[]).includes(state)) return [];
  const milestones = await Milestone.findAll({ where: { trialId } });
  const enrollments = await Enrollment.findAll({
    where: { trialId, status: 'active' },
    include: [{ model: User, as: 'user' }, { model: Report, as: 'reports' }],
  });
  return enrollments
    .flatMap((e) => {
      const user = (e as Enrollment & { user?: User }).user;
      const reports = (e as Enrollment & { reports?: Report[] }).reports ?? [];
      if (!user) return [];
      return TESTER_MILESTONES.flatMap((kind) => {
        const due = dueFor(e, milestones, kind);
        if (!due || reports.some((r) => r.stage === STAGE_OF[kind] && r.submittedAt)) return [];
        return upcomingReminders(due, user.timeZone, now).map((p) => ({
          tester: user.name,
          what: WHAT_IS_DUE[kind] ?? kind,
          stage: p.stage,
          sendAt: p.sendAt,
          timeZone: user.timeZone,
          turnedOff: !user.mailReminders,
        }));
      });
    })
    .sort((a, b) => a.sendAt.getTime() - b.sendAt.getTime());
}

/** Mounted at /api/studios/:studioId/trials/:trialId/mail: the trial's outbox for its managers. */
export function trialMailRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const manage = requireStudio('applicants.manage', "see or resend the trial's mail");
  const trial = uuidParam('trialId', 'trial');
  const ids = (req: Request, res: Response) => ({ studioId: res.locals.membership!.studioId as string, trialId: String(req.params.trialId) });

  router.get('/', manage, trial, async (req, res) => {
    const { studioId, trialId } = ids(req, res);
    const found = await loadTrial(studioId, trialId);
    const messages = await trialOutbox(found.id);
    res.json({ messages: messages.map(serializeOutboxMessage), upcoming: await plannedReminders(found.id, found.state, new Date()) });
  });

  router.post('/:messageId/resend', manage, trial, uuidParam('messageId', 'message'), async (req, res) => {
    const { studioId, trialId } = ids(req, res);
    const found = await loadTrial(studioId, trialId);
    const row = await resend(deps, found.id, String(req.params.messageId));
    res.json(serializeOutboxMessage((await trialOutbox(found.id)).find((m) => m.id === row.id) ?? row));
  });
  return router;
}

function page(title: string, body: string): string {
  const esc = (v: string) => v.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  return (
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<title>${esc(title)} · Basted</title></head>` +
    `<body style="font-family:Helvetica,Arial,sans-serif;color:#1F1D1A;max-width:560px;margin:40px auto;padding:0 16px;line-height:1.5">` +
    `<p style="font-weight:bold;color:#2E5E58;font-size:18px">Basted</p><h1 style="font-size:20px">${esc(title)}</h1><p>${esc(body)}</p></body></html>`
  );
}

/**
 * Mounted at /api/mail: the one-click opt-out. The signed link is the credential (no sign-in),
 * and it can only turn one kind of optional mail off for the person it was made for.
 */
export function mailLinksRouter(deps: AppDeps): Router {
  const router = Router();
  const optOut = async (token: string) => {
    const claims = readOptOutToken(token, deps.config.auth);
    if (!claims) return null;
    const user = await User.findByPk(claims.userId);
    if (!user) return null;
    await user.update({ [OPTIONAL_KINDS[claims.kind].field]: false });
    return claims.kind;
  };
  router.get('/opt-out/:token', async (req, res) => {
    const kind = await optOut(String(req.params.token));
    res.setHeader('Cache-Control', 'no-store');
    if (!kind) {
      res.status(400).type('html').send(page('This link does not work', 'The link is incomplete or was not made by Basted. Change what mail you get from your profile instead.'));
      return;
    }
    res
      .type('html')
      .send(page('Done: no more of this mail', `You will no longer get ${OPTIONAL_KINDS[kind].label}. Mail about your account (such as password resets) still reaches you. You can turn it back on from your profile.`));
  });
  // RFC 8058 one-click: mail programs POST to the List-Unsubscribe address.
  router.post('/opt-out/:token', async (req, res) => {
    const kind = await optOut(String(req.params.token));
    if (!kind) throw badRequest('This opt-out link is not valid.', { token: 'is not valid' });
    res.json({ turnedOff: kind });
  });
  return router;
}

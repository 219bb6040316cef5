import express, { Router, type Request, type Response } from 'express';
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

const esc = (v: string) => v.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A small page of its own (no app needed): the opt-out link is opened from an e-mail. */
function page(title: string, body: string, form?: { action: string; button: string }): string {
  const button = form
    ? `<form method="post" action="${esc(form.action)}"><input type="hidden" name="confirm" value="stop">` +
      `<button type="submit" style="font:inherit;font-weight:bold;color:#fff;background:#2E5E58;border:0;border-radius:6px;padding:12px 20px;min-height:44px;cursor:pointer">${esc(form.button)}</button></form>`
    : '';
  return (
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<meta name="robots" content="noindex"><title>${esc(title)} · Basted</title></head>` +
    `<body style="font-family:Helvetica,Arial,sans-serif;color:#1F1D1A;max-width:560px;margin:40px auto;padding:0 16px;line-height:1.5">` +
    `<p style="font-weight:bold;color:#2E5E58;font-size:18px">Basted</p><h1 style="font-size:20px">${esc(title)}</h1><p>${esc(body)}</p>${button}</body></html>`
  );
}

const BAD_LINK = ['This link does not work', 'The link is incomplete or was not made by Basted. Change what mail you get from your profile instead.'] as const;

/**
 * Mounted at /api/mail: the opt-out link of optional mail. The signed link is the credential (no
 * sign-in), and it can only turn one kind of optional mail off for the person it was made for.
 * Opening it (GET) changes nothing: mail scanners open links on their own. The page it shows
 * says what will stop and has a button that stops it (POST). Mail programs that offer
 * unsubscribing themselves POST straight to the same address (RFC 8058 one-click).
 */
export function mailLinksRouter(deps: AppDeps): Router {
  const router = Router();
  const read = async (token: string) => {
    const claims = readOptOutToken(token, deps.config.auth);
    if (!claims) return null;
    const user = await User.findByPk(claims.userId);
    return user ? { user, kind: claims.kind } : null;
  };
  router.get('/opt-out/:token', async (req, res) => {
    const found = await read(String(req.params.token));
    res.setHeader('Cache-Control', 'no-store');
    if (!found) {
      res.status(400).type('html').send(page(...BAD_LINK));
      return;
    }
    const { label, field } = OPTIONAL_KINDS[found.kind];
    if (!found.user[field]) {
      res.type('html').send(page('This mail is already off', `You no longer get ${label}. You can turn it back on from your profile.`));
      return;
    }
    res
      .type('html')
      .send(
        page(`Stop ${label}?`, `You will no longer get ${label}. Mail about your account (such as password resets) still reaches you, and you can turn this back on from your profile.`, {
          action: req.originalUrl.split('?')[0],
          button: `Stop ${label}`,
        }),
      );
  });
  // The page's button (a form: confirm=stop), or a mail program's one-click POST
  // (List-Unsubscribe=One-Click, RFC 8058 section 3.2).
  router.post('/opt-out/:token', express.urlencoded({ extended: false, limit: '1kb' }), async (req, res) => {
    const fromPage = (req.body as Record<string, unknown> | undefined)?.confirm === 'stop';
    const found = await read(String(req.params.token));
    res.setHeader('Cache-Control', 'no-store');
    if (!found) {
      if (fromPage) {
        res.status(400).type('html').send(page(...BAD_LINK));
        return;
      }
      throw badRequest('This opt-out link is not valid.', { token: 'is not valid' });
    }
    const { label, field } = OPTIONAL_KINDS[found.kind];
    await found.user.update({ [field]: false });
    if (fromPage) {
      res.type('html').send(page('Done: no more of this mail', `You will no longer get ${label}. Mail about your account (such as password resets) still reaches you. You can turn it back on from your profile.`));
      return;
    }
    res.json({ turnedOff: found.kind });
  });
  return router;
}

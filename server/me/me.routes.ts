import { Router } from 'express';
import type { AppDeps } from '../app';
import { clearSessionCookie } from '../auth/authenticate';
import { requireUser } from '../auth/guards';
import { myAnnouncements } from '../community/announcements.service';
import { deleteAccountSchema } from '../domain/schemas/release';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { deleteAccount } from './account.service';
import { assertFeedOwner, calendarFor, feedOwner, myFeed, renewFeed, stopFeed } from './calendar.service';
import { writeExportZip } from './export.service';
import { finalFileLink, myReleases } from './releases.service';

/** Mounted at /api/me: a person's announcements, released trials, calendar, data export and account deletion. */
export function myDataRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/announcements', requireUser, async (_req, res) => {
    res.json(await myAnnouncements(res.locals.user!));
  });
  router.get('/releases', requireUser, async (_req, res) => {
    res.json(await myReleases(res.locals.user!));
  });
  router.post('/final-files/:fileId/link', requireUser, uuidParam('fileId', 'file'), async (req, res) => {
    res.json(await finalFileLink(String(req.params.fileId), res.locals.user!, deps.storage));
  });

  router.get('/calendar', requireUser, async (_req, res) => {
    res.json(await myFeed(deps.config, res.locals.user!));
  });
  router.post('/calendar/feed', requireUser, async (_req, res) => {
    res.json(await renewFeed(deps.config, res.locals.user!));
  });
  router.delete('/calendar/feed', requireUser, async (_req, res) => {
    await stopFeed(res.locals.user!);
    res.status(204).end();
  });
  router.get('/calendar.ics', requireUser, async (_req, res) => {
    res.type('text/calendar; charset=utf-8').attachment('basted-due-dates.ics').send(await calendarFor(deps.config, res.locals.user!));
  });

  router.get('/export.zip', requireUser, async (_req, res) => {
    const user = res.locals.user!;
    res.status(200).type('application/zip').attachment(`basted-my-data-${new Date().toISOString().slice(0, 10)}.zip`);
    res.setHeader('Cache-Control', 'no-store');
    try {
      await writeExportZip(user, deps.storage, (chunk) => res.write(chunk));
      res.end();
    } catch (error) {
      // The headers are out: a broken archive must not look complete.
      console.error('[export] failed:', error);
      res.destroy(error as Error);
    }
  });

  router.delete('/account', requireUser, validate({ body: deleteAccountSchema }), async (_req, res) => {
    const result = await deleteAccount(res.locals.user!, res.locals.body, deps.storage);
    clearSessionCookie(res, deps.config.auth);
    res.json(result);
  });
  return router;
}

/** Mounted at /api/calendar: the private feed calendar apps subscribe to; the address is the credential. */
export function calendarFeedRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/:token', async (req, res) => {
    const token = String(req.params.token);
    const user = assertFeedOwner(token, await feedOwner(token, deps.config.auth));
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.type('text/calendar; charset=utf-8').send(await calendarFor(deps.config, user));
  });
  return router;
}

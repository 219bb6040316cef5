import express, { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '../app';
import { requireStudio } from '../auth/guards';
import { listAnnouncements, sendAnnouncement } from '../community/announcements.service';
import { copyTrial } from '../community/pool.service';
import { announcementSchema, copyTrialSchema, excuseSchema, releaseSchema, releaseSettingsSchema, rewardCodesSchema } from '../domain/schemas/release';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { serializeTrial } from '../trials/trial-serializer';
import { loadTrial } from '../trials/trials.service';
import { excuseTester, releaseStatus, releaseTrial, updateReleaseSettings } from './release.service';
import { assignAndSendRewardCodes, importRewardCodes, listRewardCodes } from './reward-codes.service';
import { summaryPdf } from './summary-pdf';
import { SUMMARY_TABLES, summaryCsv, trialSummary } from './summary.service';

const tableParams = z.object({ table: z.enum(SUMMARY_TABLES, { error: `is one of ${SUMMARY_TABLES.join(', ')}` }) });

/**
 * Mounted at /api/studios/:studioId/trials/:trialId: the trial summary (page, PDF, CSV), the
 * release checklist and the release itself, reward codes, announcements and copying the trial.
 */
export function trialReleaseRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const trial = uuidParam('trialId', 'trial');
  const studioId = (res: express.Response) => res.locals.membership!.studioId;
  const trialId = (req: express.Request) => String(req.params.trialId);
  const read = requireStudio('trials.read', 'see the trial summary');
  const write = requireStudio('trials.write', 'release or change the trial');
  const manage = requireStudio('applicants.manage', 'manage the trial’s testers');

  router.get('/summary', read, trial, async (req, res) => {
    res.json(await trialSummary(studioId(res), trialId(req), res.locals.user!, deps.storage));
  });
  router.get('/summary.pdf', read, trial, async (req, res) => {
    const summary = await trialSummary(studioId(res), trialId(req), res.locals.user!);
    const pdf = await summaryPdf(summary, deps.storage);
    res.type('application/pdf').attachment(`${summary.trial.slug}-summary.pdf`).send(pdf);
  });
  router.get('/summary/:table.csv', read, trial, validate({ params: tableParams }), async (req, res) => {
    const { table } = res.locals.params as z.output<typeof tableParams>;
    const summary = await trialSummary(studioId(res), trialId(req), res.locals.user!);
    res.type('text/csv').attachment(`${summary.trial.slug}-${table}.csv`).send(summaryCsv(summary, table));
  });

  router.get('/release', read, trial, async (req, res) => {
    res.json(await releaseStatus(studioId(res), trialId(req)));
  });
  router.patch('/release', write, trial, validate({ body: releaseSettingsSchema }), async (req, res) => {
    res.json(await updateReleaseSettings(studioId(res), trialId(req), res.locals.body));
  });
  router.post('/release', write, trial, validate({ body: releaseSchema }), async (req, res) => {
    res.json(await releaseTrial(studioId(res), trialId(req), res.locals.user!, res.locals.body, deps));
  });
  router.patch('/enrollments/:enrollmentId/excuse', manage, trial, uuidParam('enrollmentId', 'enrollment'), validate({ body: excuseSchema }), async (req, res) => {
    res.json(await excuseTester(studioId(res), trialId(req), String(req.params.enrollmentId), res.locals.body));
  });

  // Reward codes are for the people who manage testers: they are the studio's to give.
  router.get('/reward-codes', manage, trial, async (req, res) => {
    res.json(await listRewardCodes(await loadTrial(studioId(res), trialId(req))));
  });
  router.post('/reward-codes', manage, trial, validate({ body: rewardCodesSchema }), async (req, res) => {
    res.status(201).json(await importRewardCodes(await loadTrial(studioId(res), trialId(req)), res.locals.body.csv));
  });
  // After a release, codes imported later go to the finishers still without one.
  router.post('/reward-codes/send', manage, trial, async (req, res) => {
    const found = await loadTrial(studioId(res), trialId(req));
    const sent = await assignAndSendRewardCodes(found, deps);
    res.json({ delivery: sent, ...(await listRewardCodes(found)) });
  });

  router.get('/announcements', read, trial, async (req, res) => {
    await loadTrial(studioId(res), trialId(req));
    res.json(await listAnnouncements(studioId(res), trialId(req)));
  });
  router.post('/announcements', write, trial, validate({ body: announcementSchema }), async (req, res) => {
    res.status(201).json(await sendAnnouncement(studioId(res), trialId(req), res.locals.user!, res.locals.body, deps));
  });

  router.post('/copy', write, trial, validate({ body: copyTrialSchema }), async (req, res) => {
    const { trial: copy, invitationsWaiting } = await copyTrial(studioId(res), trialId(req), res.locals.user!, res.locals.body);
    res.status(201).json({ trial: serializeTrial(copy), invitationsWaiting });
  });
  return router;
}

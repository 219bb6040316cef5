import { Router, type Response } from 'express';
import { z } from 'zod';
import { requireStudio, requireUser } from '../auth/guards';
import { toCsv } from '../csv';
import { otherTextKey } from '../domain/schemas/findings';
import { otherMappingsOf } from '../findings/findings.service';
import { countedAlterations, reportSaveSchema, reportSubmitSchema } from '../domain/schemas/reports';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { loadTrial } from '../trials/trials.service';
import { readPage, sendPage } from '../pagination';
import { trialReportsPage } from './report-pages';
import { getReport, saveReport, StaleReportError, submitReport, trialReports, type Stage } from './reports.service';

const stageParam = z.object({ stage: z.enum(['check-in', 'final'], { error: 'The report is the check-in or the final one' }) });
const listQuery = z.object({
  stage: z.enum(['check-in', 'final']).optional(),
  size: z.uuid({ error: 'is not a size' }).optional(),
  draft: z.coerce.number({ error: 'is a draft number' }).int('is a draft number').min(1, 'is a draft number').optional(),
  /** A variant's name, or "-" for the main pattern (no variant). */
  variant: z.string().trim().min(1).max(80).optional(),
});

/** Mounted at /api: a tester's own reports. */
export function myReportsRouter(): Router {
  const router = Router();
  const base = '/me/enrollments/:enrollmentId/reports/:stage';
  const guard = [requireUser, uuidParam('enrollmentId', 'enrollment'), validate({ params: stageParam })];
  const stage = (res: Response) => (res.locals.params as { stage: Stage }).stage;

  router.get(base, ...guard, async (req, res) => {
    res.json(await getReport(String(req.params.enrollmentId), stage(res), res.locals.user!));
  });
  // A stale save or submission: 409 with the report as it now is, so the sender can put its
  // changes on top of it and try again.
  const answerStale = (res: Response, error: unknown) => {
    if (!(error instanceof StaleReportError)) throw error;
    res.status(409).json({ error: { code: error.code, message: error.message }, report: error.current });
  };
  // Saved as the tester goes: a reload or a lost connection loses nothing already sent.
  router.put(base, ...guard, validate({ body: reportSaveSchema }), async (req, res) => {
    try {
      res.json(await saveReport(String(req.params.enrollmentId), stage(res), res.locals.user!, res.locals.body));
    } catch (error) {
      answerStale(res, error);
    }
  });
  router.post(`${base}/submit`, ...guard, validate({ body: reportSubmitSchema }), async (req, res) => {
    try {
      res.json(await submitReport(String(req.params.enrollmentId), stage(res), res.locals.user!, res.locals.body));
    } catch (error) {
      answerStale(res, error);
    }
  });
  return router;
}

/** Mounted at /api/studios/:studioId/trials/:trialId/reports (and .csv): the staff's view. */
export function trialReportsRouter(): Router {
  const router = Router({ mergeParams: true });
  const read = requireStudio('trials.read', 'see reports');
  const load = async (studioId: string, trialId: string) => loadTrial(studioId, trialId);

  router.get('/reports', read, uuidParam('trialId', 'trial'), validate({ query: listQuery }), async (req, res) => {
    const q = res.locals.query as z.output<typeof listQuery>;
    const page = readPage(req);
    const trial = await load(res.locals.membership!.studioId, String(req.params.trialId));
    // A page at a time (Link: rel="next"), so a trial of thousands of testers is never one huge answer.
    const { items, next } = await trialReportsPage(trial, { stage: q.stage, sizeId: q.size, draft: q.draft, variant: q.variant }, page.limit, page.after);
    sendPage(req, res, items, next);
  });

  // One row per alteration (and one per report without any), for a spreadsheet.
  router.get('/reports.csv', read, uuidParam('trialId', 'trial'), validate({ query: listQuery }), async (req, res) => {
    const q = res.locals.query as z.output<typeof listQuery>;
    const trial = await load(res.locals.membership!.studioId, String(req.params.trialId));
    const mapped = await otherMappingsOf(trial.id);
    const rows = (await trialReports(trial, { stage: q.stage, sizeId: q.size, draft: q.draft, variant: q.variant })).flatMap((r): Record<string, string | number | boolean>[] => {
      const f = r.content.fabric;
      const base = {
        tester: r.tester,
        size: r.size,
        size_sewn: r.content.sizeSewn ?? '',
        variant: r.content.variantSewn ?? '',
        stage: r.stage,
        draft: r.content.draftVersion ?? '',
        submitted: r.submittedAt?.toISOString() ?? '',
        on_time: r.onTime ?? '',
        fabric: f ? [f.kind, f.fibre].filter(Boolean).join(', ') : '',
        fabric_width_mm: f?.widthMm ?? '',
        fabric_used_mm: f?.usedMm ?? '',
        stretch_pct: f?.stretchPct ?? '',
        one_way: f ? f.napped : '',
      };
      // Rows the tester has not finished (no kind or no amount yet) are not alterations yet.
      const alterations = countedAlterations(r.content);
      return alterations.length
        ? alterations.map((a) => ({ ...base, area: a.area ?? '', kind: a.kind === 'other' ? `other: ${a.otherText}` : a.kind, read_as: a.kind === 'other' ? (mapped.get(otherTextKey(a.otherText)) ?? '') : '', amount_mm: a.amountMm, where: a.where ?? '', note: a.note }))
        : [{ ...base, area: '', kind: '', read_as: '', amount_mm: '', where: '', note: '' }];
    });
    res.type('text/csv').attachment(`${trial.slug}-reports.csv`).send(toCsv(rows));
  });
  return router;
}

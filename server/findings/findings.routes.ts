import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { requireStudio } from '../auth/guards';
import { findingNoteSchema, otherMappingSchema, triageSchema } from '../domain/schemas/findings';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { loadTrial } from '../trials/trials.service';
import { addFindingNote, changesCsv, findingsFor, mapOtherAlteration, otherAlterations, triageFinding } from './findings.service';

const findingsQuery = z.object({
  draft: z.string().regex(/^\d+$/, 'is a draft number').optional(),
  compare: z.string().regex(/^\d+,\d+$/, 'is two draft numbers, e.g. 1,2').optional(),
});

/** Mounted at /api/studios/:studioId/trials/:trialId: the findings of a trial and what the studio decided. */
export function findingsRouter(): Router {
  const router = Router({ mergeParams: true });
  const trial = uuidParam('trialId', 'trial');
  const load = (req: Request, res: Response) => loadTrial(res.locals.membership!.studioId, String(req.params.trialId));
  // Graders included: they are the ones who read the grading findings.
  const read = requireStudio('trials.read', 'see findings');
  const triage = requireStudio('findings.triage', 'triage findings');
  const map = requireStudio('alterations.map', 'map alterations to kinds');

  router.get('/findings', read, trial, validate({ query: findingsQuery }), async (req, res) => {
    const q = res.locals.query as z.output<typeof findingsQuery>;
    res.json(await findingsFor(await load(req, res), { draft: q.draft, compare: q.compare ? (q.compare.split(',') as [string, string]) : undefined }, res.locals.user!));
  });
  // The next-draft change table (findings triaged "will fix"), for a spreadsheet.
  router.get('/findings/changes.csv', read, trial, validate({ query: findingsQuery.pick({ draft: true }) }), async (req, res) => {
    const q = res.locals.query as { draft?: string };
    const found = await load(req, res);
    res.type('text/csv').attachment(`${found.slug}-draft-changes.csv`).send(await changesCsv(found, q.draft, res.locals.user!));
  });
  router.put('/findings/triage', triage, trial, validate({ body: triageSchema }), async (req, res) => {
    res.json(await triageFinding(await load(req, res), res.locals.user!, res.locals.body));
  });
  router.post('/findings/notes', triage, trial, validate({ body: findingNoteSchema }), async (req, res) => {
    res.status(201).json(await addFindingNote(await load(req, res), res.locals.user!, res.locals.body));
  });

  // "Other" alterations by their words, and the kind a coordinator reads each as.
  router.get('/other-alterations', map, trial, async (req, res) => {
    res.json(await otherAlterations(await load(req, res)));
  });
  router.put('/other-alterations', map, trial, validate({ body: otherMappingSchema }), async (req, res) => {
    res.json(await mapOtherAlteration(await load(req, res), res.locals.user!, res.locals.body));
  });
  return router;
}

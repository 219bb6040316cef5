import express, { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '../app';
import { requireStudio } from '../auth/guards';
import { patternDraftsRouter } from '../drafts/drafts.routes';
import { FINISHED_MEASUREMENTS } from '../domain/garments';
import { MEASUREMENTS } from '../domain/measurements';
import { adviceRequestSchema, chartSchema, createPatternSchema, fabricNeedsSchema, updatePatternSchema } from '../domain/schemas/patterns';
import { AppError } from '../errors';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { chartToCsv, csvToChart, type CsvColumn } from './chart-csv';
import { serializeChart, serializePattern, serializePatternSummary } from './pattern-serializer';
import { createPattern, listPatterns, loadPattern, saveChart, saveFabricNeeds, updatePattern } from './patterns.service';
import { adviceFor, myAdvice } from './size-advice.service';

const CSV_CATALOG: CsvColumn[] = [
  ...MEASUREMENTS.map((m) => ({ key: m.key, label: m.label, kind: 'body' as const })),
  ...FINISHED_MEASUREMENTS.map((m) => ({ key: m.key, label: m.label, kind: 'finished' as const })),
];

const listQuery = z.object({ archived: z.enum(['true', 'false'], { error: 'must be true or false' }).optional() });

/** Mounted at /api/studios/:studioId/patterns. */
export function patternsRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const studioId = (res: express.Response) => res.locals.membership!.studioId;
  const read = requireStudio('patterns.read', 'see patterns');
  const write = requireStudio('patterns.write', 'change patterns');
  const pattern = uuidParam('patternId', 'pattern');

  router.get('/', read, validate({ query: listQuery }), async (_req, res) => {
    const patterns = await listPatterns(studioId(res), res.locals.query.archived === 'true');
    res.json(patterns.map(serializePatternSummary));
  });

  router.post('/', write, validate({ body: createPatternSchema }), async (_req, res) => {
    res.status(201).json(serializePattern(await createPattern(studioId(res), res.locals.body)));
  });

  router.get('/:patternId', read, pattern, async (req, res) => {
    res.json(serializePattern(await loadPattern(studioId(res), String(req.params.patternId))));
  });

  router.patch('/:patternId', write, pattern, validate({ body: updatePatternSchema }), async (req, res) => {
    res.json(serializePattern(await updatePattern(studioId(res), String(req.params.patternId), res.locals.body)));
  });

  router.put('/:patternId/chart', write, pattern, validate({ body: chartSchema }), async (req, res) => {
    res.json(serializePattern(await saveChart(studioId(res), String(req.params.patternId), res.locals.body)));
  });

  router.put('/:patternId/fabric-needs', write, pattern, validate({ body: fabricNeedsSchema }), async (req, res) => {
    const { lengthUnit, fabricUnit } = res.locals.user!;
    res.json(serializePattern(await saveFabricNeeds(studioId(res), String(req.params.patternId), res.locals.body, { lengthUnit, fabricUnit })));
  });

  // The chart as a spreadsheet, in the caller's unit.
  router.get('/:patternId/chart.csv', read, pattern, async (req, res) => {
    const found = await loadPattern(studioId(res), String(req.params.patternId));
    const csv = chartToCsv(serializeChart(found), CSV_CATALOG, res.locals.user!.lengthUnit);
    const name = found.name.replace(/[^\w-]+/g, '-').replace(/^-|-$/g, '') || 'chart';
    res.type('text/csv').attachment(`${name}-size-chart.csv`).send(csv);
  });

  // Replaces the sizes and columns from a spreadsheet; variants and the drafted height stay.
  // Any problem in the file: 400 listing each by row and column, and nothing is saved.
  router.post(
    '/:patternId/chart.csv',
    write,
    pattern,
    express.text({ type: ['text/csv', 'text/plain', 'application/vnd.ms-excel'], limit: '512kb' }),
    async (req, res) => {
      if (typeof req.body !== 'string' || req.body.trim() === '') {
        throw new AppError(400, 'invalid_input', 'Send the chart as CSV text (Content-Type: text/csv).', { file: 'is empty or not CSV' });
      }
      const parsed = csvToChart(req.body, CSV_CATALOG, res.locals.user!.lengthUnit);
      if (!parsed.ok) {
        const fields = Object.fromEntries(
          parsed.problems.map((p) => [`row ${p.row}${p.column ? `, column ${p.column}` : ''}`, p.message]),
        );
        throw new AppError(400, 'invalid_csv', `The file has ${parsed.problems.length} problem${parsed.problems.length === 1 ? '' : 's'}; nothing was saved.`, fields);
      }
      const current = serializeChart(await loadPattern(studioId(res), String(req.params.patternId)));
      const labelOf = new Map(current.sizes.map((s) => [s.id, s.label.toLowerCase()]));
      const newLabels = new Set(parsed.chart.sizes.map((s) => s.label.toLowerCase()));
      const chart = chartSchema.safeParse({
        draftedHeightMm: current.draftedHeightMm,
        bodyColumns: parsed.chart.bodyColumns,
        finishedColumns: parsed.chart.finishedColumns,
        // A size whose label is still in the file keeps its identity.
        sizes: parsed.chart.sizes.map((s) => ({
          ...s,
          id: current.sizes.find((c) => c.label.toLowerCase() === s.label.toLowerCase())?.id,
        })),
        variants: current.variants
          .map((v) => ({
            ...v,
            kind: v.kind as 'fuller-belly' | 'cup' | 'other',
            columns: v.columns.filter((c) => parsed.chart.bodyColumns.includes(c)),
            valuesMm: Object.fromEntries(
              Object.entries(v.valuesMm)
                .filter(([sizeId]) => newLabels.has(labelOf.get(sizeId) ?? ''))
                .map(([sizeId, values]) => [
                  sizeId,
                  Object.fromEntries(Object.entries(values).filter(([k]) => parsed.chart.bodyColumns.includes(k))),
                ]),
            ),
          })),
      });
      if (!chart.success) {
        // Name the spreadsheet's row and column rather than the JSON path.
        const fields: Record<string, string> = {};
        for (const issue of chart.error.issues) {
          const [part, index, , key] = issue.path;
          fields[part === 'sizes' && typeof index === 'number' ? `row ${index + 2}${key ? `, column ${String(key)}` : ''}` : issue.path.join('.')] =
            issue.message;
        }
        throw new AppError(400, 'invalid_csv', 'Some values in the file are not plausible; nothing was saved.', fields);
      }
      res.json(serializePattern(await saveChart(studioId(res), String(req.params.patternId), chart.data)));
    },
  );

  router.use('/:patternId/drafts', patternDraftsRouter(deps));

  // Advice for the caller's own saved measurements; testers included (see the policy).
  router.get('/:patternId/size-advice', requireStudio('patterns.adviseSelf', 'get size advice'), pattern, async (req, res) => {
    const found = await loadPattern(studioId(res), String(req.params.patternId));
    const { measurementsMm, advice } = await myAdvice(found, res.locals.user!);
    res.json({ pattern: { id: found.id, name: found.name, category: found.category }, measurementsMm, advice });
  });

  // Staff try the chart against any measurements, e.g. while editing it.
  router.post('/:patternId/size-advice', read, pattern, validate({ body: adviceRequestSchema }), async (req, res) => {
    const found = await loadPattern(studioId(res), String(req.params.patternId));
    const advice = await adviceFor(found, res.locals.body.measurementsMm, res.locals.user!.lengthUnit);
    res.json({ pattern: { id: found.id, name: found.name, category: found.category }, measurementsMm: res.locals.body.measurementsMm, advice });
  });

  return router;
}

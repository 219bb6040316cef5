import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { AppDeps } from '../app';
import { requireStudio, requireUser } from '../auth/guards';
import { DRAFT_FILE_KINDS, type DraftFileKind } from '../domain/drafts';
import { DRAFT_MAX_BYTES } from '../files/content-check';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import type { Draft } from '../../db/models';
import { createDraft, downloadLink, draftsForTrial, listDrafts } from './drafts.service';

// In memory: a draft is checked by content before anything is stored, and files are capped.
// Browsers send file names as UTF-8 without saying so; busboy's default reads them as latin1
// and stores "café" as "cafÃ©".
const upload = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: DRAFT_MAX_BYTES, files: DRAFT_FILE_KINDS.length } });
const noteSchema = z.object({ changeNote: z.string({ error: 'Say what changed in this draft' }).trim().min(3, 'Say what changed in this draft').max(5000) });

function serializeDraft(draft: Draft, withDownloads: boolean) {
  return {
    id: draft.id,
    version: draft.version,
    changeNote: draft.changeNote,
    createdAt: draft.createdAt,
    files: (draft.files ?? []).map((f) => ({
      id: f.id,
      kind: f.kind,
      name: f.originalName,
      bytes: f.bytes,
      ...(withDownloads
        ? {
            // Who has this file: one line per person, with their latest download.
            downloadedBy: Object.values(
              (f.downloads ?? []).reduce<Record<string, { name: string; at: Date }>>((acc, d) => {
                const prev = acc[d.userId];
                if (!prev || prev.at < d.createdAt) acc[d.userId] = { name: d.user?.name ?? '', at: d.createdAt };
                return acc;
              }, {}),
            ),
          }
        : {}),
    })),
  };
}

/** Mounted at /api/studios/:studioId/patterns/:patternId/drafts. */
export function patternDraftsRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const pattern = uuidParam('patternId', 'pattern');

  router.get('/', requireStudio('patterns.read', 'see drafts'), pattern, async (req, res) => {
    res.json((await listDrafts(res.locals.membership!.studioId, String(req.params.patternId))).map((d) => serializeDraft(d, true)));
  });

  router.post(
    '/',
    requireStudio('patterns.write', 'upload drafts'),
    pattern,
    upload.fields(DRAFT_FILE_KINDS.map((name) => ({ name, maxCount: 1 }))),
    validate({ body: noteSchema }),
    async (req, res) => {
      const { changeNote } = res.locals.body as z.output<typeof noteSchema>;
      const files = Object.entries((req.files ?? {}) as Record<string, Express.Multer.File[]>).flatMap(([kind, list]) =>
        list.map((f) => ({ kind: kind as DraftFileKind, originalName: f.originalname, buffer: f.buffer })),
      );
      const draft = await createDraft(
        { studioId: res.locals.membership!.studioId, patternId: String(req.params.patternId), changeNote, files, user: res.locals.user! },
        deps,
      );
      res.status(201).json(serializeDraft(draft, false));
    },
  );
  return router;
}

/** Mounted at /api: a tester's drafts of a trial, and the short-lived download links. */
export function draftLinksRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/me/trials/:trialId/drafts', requireUser, uuidParam('trialId', 'trial'), async (req, res) => {
    res.json((await draftsForTrial(String(req.params.trialId), res.locals.user!)).map((d) => serializeDraft(d, false)));
  });
  router.post('/draft-files/:fileId/link', requireUser, uuidParam('fileId', 'file'), async (req, res) => {
    res.json(await downloadLink(String(req.params.fileId), res.locals.user!, deps.storage));
  });
  return router;
}


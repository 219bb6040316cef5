import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { RouteDeps } from '../app';
import { requireStudio, requireUser } from '../auth/guards';
import { PHOTO_MAX_BYTES } from '../files/content-check';
import { rateLimit } from '../middleware/rate-limit';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { loadTrial } from '../trials/trials.service';
import { trialPhotoWall } from './photo-wall.service';
import { addPhoto, deletePhoto, myPhotos, ownEnrollment, ownPhoto, photoLink, serializePhoto, setPhotoConsent } from './photos.service';

// Browsers send file names as UTF-8 without saying so; busboy's default reads them as latin1
// and stores "café" as "cafÃ©".
const upload = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: PHOTO_MAX_BYTES, files: 1 } });
const photoFields = z.object({
  stage: z.enum(['check-in', 'final'], { error: 'Say whether the photo is for the check-in or the final report' }),
  view: z.enum(['front', 'side', 'back', 'detail'], { error: 'Choose front, side, back or detail' }),
  consent: z.enum(['staff-only', 'may-share'], { error: 'Choose who may see the photo' }),
});
const consentBody = z.object({ consent: photoFields.shape.consent });
const wallQuery = z.object({
  stage: photoFields.shape.stage.optional(),
  view: photoFields.shape.view.optional(),
  size: z.uuid({ error: 'is not a size' }).optional(),
});

/** Mounted at /api: a tester's photos of their own enrolment, and photo links for tester and staff. */
export function photosRouter(deps: RouteDeps): Router {
  const router = Router();
  const enrollment = uuidParam('enrollmentId', 'enrollment');

  router.get('/me/enrollments/:enrollmentId/photos', requireUser, enrollment, async (req, res) => {
    res.json((await myPhotos(String(req.params.enrollmentId), res.locals.user!)).map(serializePhoto));
  });

  // Ownership is checked before the upload is read, so an outsider learns nothing and sends nothing.
  const own: RequestHandler = async (req, res, next) => {
    await ownEnrollment(String(req.params.enrollmentId), res.locals.user!);
    next();
  };

  // Per person, counted before the upload is read; a refused upload is given back.
  const uploads = rateLimit(deps.limiters.photoUploads, { key: (_req, res) => res.locals.user!.id, who: 'your account (photo uploads)', refundRefused: true });

  router.post('/me/enrollments/:enrollmentId/photos', requireUser, enrollment, own, uploads, upload.single('photo'), async (req, res) => {
    const fields = photoFields.parse(req.body ?? {});
    if (!req.file) {
      res.status(400).json({ error: { code: 'invalid_input', message: 'Attach the photo as the “photo” field.', fields: { photo: 'no file was sent' } } });
      return;
    }
    const photo = await addPhoto(String(req.params.enrollmentId), res.locals.user!, fields, { buffer: req.file.buffer, name: req.file.originalname }, deps.storage);
    res.status(201).json(serializePhoto(photo));
  });

  router.delete('/me/photos/:photoId', requireUser, uuidParam('photoId', 'photo'), async (req, res) => {
    await deletePhoto(String(req.params.photoId), res.locals.user!, deps.storage);
    res.status(204).end();
  });

  // Ownership first, so someone else's photo is not found whatever the body says.
  router.patch(
    '/me/photos/:photoId',
    requireUser,
    uuidParam('photoId', 'photo'),
    async (req, res, next) => {
      await ownPhoto(String(req.params.photoId), res.locals.user!);
      next();
    },
    validate({ body: consentBody }),
    async (req, res) => {
      const { consent } = res.locals.body as z.output<typeof consentBody>;
      res.json(serializePhoto(await setPhotoConsent(String(req.params.photoId), res.locals.user!, consent)));
    },
  );

  // The trial's staff see its photos side by side; thumbnail links are signed after this check.
  router.get(
    '/studios/:studioId/trials/:trialId/photos',
    requireStudio('trials.read', 'see the photos of trials'),
    uuidParam('trialId', 'trial'),
    validate({ query: wallQuery }),
    async (req, res) => {
      const q = res.locals.query as z.output<typeof wallQuery>;
      const trial = await loadTrial(res.locals.membership!.studioId, String(req.params.trialId));
      res.json(await trialPhotoWall(trial, { stage: q.stage, view: q.view, sizeId: q.size }, deps.storage));
    },
  );

  router.post('/photos/:photoId/link', requireUser, uuidParam('photoId', 'photo'), async (req, res) => {
    const size = req.query.size === 'thumb' ? 'thumb' : 'full';
    res.json(await photoLink(String(req.params.photoId), size, res.locals.user!, deps.storage));
  });
  return router;
}

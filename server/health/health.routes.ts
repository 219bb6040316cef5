import { Router } from 'express';
import type { RouteDeps } from '../app';
import { createHealthCache } from './health-cache';

export function healthRouter(deps: RouteDeps): Router {
  const router = Router();
  const cache = createHealthCache(deps);
  // 503 when any part is down, so a load balancer takes the instance out of rotation. The answer
  // is at most a few seconds old (health-cache.ts).
  router.get('/', async (_req, res) => {
    const health = await cache.get();
    res.status(health.status === 'ok' ? 200 : 503).json(health);
  });
  // Liveness: the process answers. Touches nothing else, so it can be asked as often as wanted.
  router.get('/live', (_req, res) => {
    res.json({ status: 'ok' });
  });
  return router;
}

import { Router } from 'express';
import type { RouteDeps } from '../app';
import { checkHealth } from './health.service';

export function healthRouter(deps: RouteDeps): Router {
  const router = Router();
  // 503 when any part is down, so a load balancer takes the instance out of rotation.
  router.get('/', async (_req, res) => {
    const health = await checkHealth(deps);
    res.status(health.status === 'ok' ? 200 : 503).json(health);
  });
  return router;
}

import type { Sequelize } from 'sequelize';
import type { Mailer } from '../mail/mailer';
import type { Storage } from '../storage/storage';
import { checkHealth, type Health } from './health.service';

/**
 * The deep check (database, file store, mail server) is kept for this long: a load balancer or a
 * monitor asking many times a second then costs one SMTP greeting and one S3 request per window,
 * and callers arriving while a check runs share it.
 */
export const HEALTH_CACHE_MS = 5000;

export type HealthCache = { get(): Promise<Health & { checkedAt: string }> };

export function createHealthCache(deps: { sequelize: Sequelize; storage: Storage; mailer: Mailer }, ttlMs = HEALTH_CACHE_MS): HealthCache {
  let held: { at: number; value: Promise<Health & { checkedAt: string }> } | null = null;
  return {
    get() {
      const now = Date.now();
      if (!held || now - held.at >= ttlMs) {
        const value = checkHealth(deps).then((h) => ({ ...h, checkedAt: new Date().toISOString() }));
        held = { at: now, value };
        // A failed check is not kept: the next caller checks again.
        value.catch(() => {
          held = null;
        });
      }
      return held.value;
    },
  };
}

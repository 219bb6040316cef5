import { z } from 'zod';
import { AppError, notFound } from '../../../server/errors';
import { toErrorResponse } from '../../../server/middleware/error-handler';

describe('toErrorResponse', () => {
  it('keeps an AppError as it is, fields included', () => {
    const res = toErrorResponse(new AppError(409, 'full', 'The size is full.', { size: 'no seats left' }));
    expect(res).toEqual({
      status: 409,
      body: { error: { code: 'full', message: 'The size is full.', fields: { size: 'no seats left' } } },
    });
  });

  it('keeps a 404 a 404', () => {
    expect(toErrorResponse(notFound('trial')).status).toBe(404);
  });

  it('turns a ZodError into a 400 naming each field by its path in `fields`, and the message names no field (forms put their own labels)', () => {
    const schema = z.object({ hip: z.number(), profile: z.object({ height: z.number().positive() }) });
    const parsed = schema.safeParse({ hip: 'wide', profile: { height: -1 } });
    const res = toErrorResponse(parsed.error);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields ?? {}).sort()).toEqual(['hip', 'profile.height']);
    expect(res.body.error.message).toBe('2 answers need a change.');
    expect(res.body.error.message).not.toMatch(/hip|height/);
  });

  it('hides the details of an unexpected error behind a 500 with a generic message', () => {
    const res = toErrorResponse(new Error('password=hunter2 in connection string'));
    expect(res.status).toBe(500);
    expect(res.body.error.message).not.toContain('hunter2');
  });
});

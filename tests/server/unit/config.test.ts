import { ConfigError, loadConfig } from '../../../server/config';

describe('loadConfig', () => {
  it('with an empty environment, gives the local development set-up', () => {
    const config = loadConfig({});
    expect(config.port).toBe(8080);
    expect(config.env).toBe('development');
    expect(config.s3.buckets).toEqual({ drafts: 'basted-drafts', photos: 'basted-photos' });
    expect(config.smtp).toMatchObject({ host: '127.0.0.1', port: 1025, secure: false });
  });

  it('when PORT is not a number, stops naming PORT', () => {
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow(ConfigError);
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow(/PORT/);
  });

  it('when several values are bad, names every one of them', () => {
    let message = '';
    try {
      loadConfig({ SMTP_PORT: '0', DATABASE_URL: 'not a url', S3_FORCE_PATH_STYLE: 'maybe' });
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(/SMTP_PORT/);
    expect(message).toMatch(/DATABASE_URL/);
    expect(message).toMatch(/S3_FORCE_PATH_STYLE/);
  });

  it('reads booleans written as true/false or 1/0', () => {
    expect(loadConfig({ SMTP_SECURE: 'true' }).smtp.secure).toBe(true);
    expect(loadConfig({ SMTP_SECURE: '0' }).smtp.secure).toBe(false);
  });

  it('in production, refuses the fake store credentials without an explicit endpoint', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/S3_ACCESS_KEY_ID/);
  });

  it('in production, never exposes the development inbox link', () => {
    const config = loadConfig({
      NODE_ENV: 'production',
      S3_ACCESS_KEY_ID: 'AKIAEXAMPLE',
      JWT_SECRET: 'x'.repeat(40),
      INBOX_URL: 'http://127.0.0.1:1080',
    });
    expect(config.inboxUrl).toBeUndefined();
  });

  it('outside development, refuses to start without a JWT secret', () => {
    expect(() => loadConfig({ NODE_ENV: 'test' })).toThrow(/JWT_SECRET: required outside development/);
    expect(() => loadConfig({ NODE_ENV: 'test', JWT_SECRET: 'short' })).toThrow(/JWT_SECRET/);
    expect(loadConfig({ NODE_ENV: 'test', JWT_SECRET: 's'.repeat(32) }).auth.jwtSecret).toBe('s'.repeat(32));
  });

  it('refuses a bcrypt cost below 10 outside tests', () => {
    expect(() => loadConfig({ BCRYPT_COST: '4' })).toThrow(/BCRYPT_COST/);
    expect(loadConfig({ BCRYPT_COST: '12' }).auth.bcryptCost).toBe(12);
  });
});

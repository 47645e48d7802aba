// The environment is checked once: defaults for development, refusals for unsafe production setups.
import { describe, expect, it } from 'vitest';
import { EnvError, LOCAL_DATABASE_URLS, loadEnv } from '@/server/env';

describe('loadEnv', () => {
  it('gives development defaults', () => {
    const env = loadEnv({});
    expect(env).toMatchObject({
      NODE_ENV: 'development',
      PORT: 8080,
      HOST: '127.0.0.1',
      DATABASE_URL: LOCAL_DATABASE_URLS.development,
      SMTP_URL: 'smtp://127.0.0.1:2525',
      PUBLIC_URL: 'http://127.0.0.1:8080',
    });
    expect(env.SESSION_SECRET.length).toBeGreaterThanOrEqual(16);
  });

  it('uses the test database under NODE_ENV=test and follows PORT in the default public URL', () => {
    const env = loadEnv({ NODE_ENV: 'test', PORT: '9090' });
    expect(env.DATABASE_URL).toBe(LOCAL_DATABASE_URLS.test);
    expect(env.PUBLIC_URL).toBe('http://127.0.0.1:9090');
  });

  it('treats empty variables as unset and trims a trailing slash off PUBLIC_URL', () => {
    const env = loadEnv({ PORT: '', PUBLIC_URL: 'https://trimwire.example/' });
    expect(env.PORT).toBe(8080);
    expect(env.PUBLIC_URL).toBe('https://trimwire.example');
  });

  it('names every bad variable', () => {
    expect(() => loadEnv({ PORT: 'eighty', SMTP_URL: 'mail.example' })).toThrow(/PORT[\s\S]*SMTP_URL/);
  });

  it('requires SESSION_SECRET and DATABASE_URL in production, and refuses the development secret', () => {
    const db = 'postgres://u:p@db.example/trimwire';
    expect(() => loadEnv({ NODE_ENV: 'production', DATABASE_URL: db })).toThrow(EnvError);
    expect(() => loadEnv({ NODE_ENV: 'production', SESSION_SECRET: 'a-long-production-secret-value' })).toThrow(/DATABASE_URL/);
    const dev = loadEnv({}).SESSION_SECRET;
    expect(() => loadEnv({ NODE_ENV: 'production', DATABASE_URL: db, SESSION_SECRET: dev })).toThrow(/development value/);
    expect(loadEnv({ NODE_ENV: 'production', DATABASE_URL: db, SESSION_SECRET: 'a-long-production-secret-value' }).NODE_ENV).toBe('production');
  });
});

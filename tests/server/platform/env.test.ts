import { describe, expect, it } from 'vitest';
import { EnvError, loadEnv } from '../../../server/platform/env';

describe('loadEnv', () => {
  it('fills the documented defaults', () => {
    const env = loadEnv({});
    expect(env).toMatchObject({ PORT: 3000, HOST: '127.0.0.1', DATA_DIR: 'data', PUBLIC_URL: 'http://localhost:3000', LOG_LEVEL: 'info', SIGN_IN_LIMIT_PER_MINUTE: 10 });
    expect(env.DEMO).toBeUndefined();
    expect(env.SMTP_URL).toBeUndefined();
    expect(env.AUTH_SECRET).toBeUndefined();
  });

  it('derives PUBLIC_URL from PORT and reads DEMO as a flag', () => {
    expect(loadEnv({ PORT: '3917' }).PUBLIC_URL).toBe('http://localhost:3917');
    expect(loadEnv({ DEMO: '0' }).DEMO).toBe(false);
    expect(loadEnv({ DEMO: 'on' }).DEMO).toBe(true);
    expect(loadEnv({ PUBLIC_URL: 'https://desk.example.test/' }).PUBLIC_URL).toBe('https://desk.example.test');
  });

  it('lists every bad variable at once', () => {
    let error: unknown;
    try {
      loadEnv({ PORT: 'eighty', DEMO: 'maybe', SMTP_URL: 'http://mail', AUTH_SECRET: 'short', LOG_LEVEL: 'loud', PUBLIC_URL: 'not a url' });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(EnvError);
    const vars = (error as EnvError).problems.map((p) => p.variable).sort();
    expect(vars).toEqual(['AUTH_SECRET', 'DEMO', 'LOG_LEVEL', 'PORT', 'PUBLIC_URL', 'SMTP_URL']);
    expect((error as EnvError).message).toContain('6 problems');
  });
});

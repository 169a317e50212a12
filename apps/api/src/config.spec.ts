import { buildConfig, parseEnv } from './config';

const REQUIRED = { DATABASE_PASSWORD: 'pw', JWT_ACCESS_SECRET: 'k'.repeat(32) };

describe('configuration', () => {
  it('fills safe local defaults around the two secrets', () => {
    const env = parseEnv(REQUIRED);
    expect(env).toMatchObject({ PORT: 4300, HOST: '127.0.0.1', DATABASE_PORT: 54329, BCRYPT_COST: 12, SMTP_PORT: 1025, OUTBOX_WORKER: true });
  });

  it('refuses to start without secrets, listing every bad variable', () => {
    expect(() => parseEnv({ PORT: 'eighty', JWT_ACCESS_SECRET: 'short' })).toThrow(
      /Invalid configuration[\s\S]*PORT: must be a port number[\s\S]*DATABASE_PASSWORD: is required[\s\S]*JWT_ACCESS_SECRET: must be at least 32 characters/,
    );
  });

  it('reads booleans and numbers from their text forms', () => {
    const env = parseEnv({ ...REQUIRED, OUTBOX_WORKER: 'false', COOKIE_SECURE: '1', ACCESS_TOKEN_TTL_SECONDS: '60' });
    expect(env).toMatchObject({ OUTBOX_WORKER: false, COOKIE_SECURE: true, ACCESS_TOKEN_TTL_SECONDS: 60 });
  });

  it('points links at the API\'s own port unless PUBLIC_BASE_URL says otherwise', () => {
    expect(buildConfig(parseEnv({ ...REQUIRED, PORT: '4480' })).publicBaseUrl).toBe('http://127.0.0.1:4480');
    expect(buildConfig(parseEnv({ ...REQUIRED, PORT: '4480', PUBLIC_BASE_URL: 'https://lab.example.test/' })).publicBaseUrl).toBe('https://lab.example.test');
  });

  it('trusts no proxy unless TRUST_PROXY names one', () => {
    expect(buildConfig(parseEnv(REQUIRED)).trustProxy).toBe(false);
    expect(buildConfig(parseEnv({ ...REQUIRED, TRUST_PROXY: '1' })).trustProxy).toBe(1);
    expect(buildConfig(parseEnv({ ...REQUIRED, TRUST_PROXY: 'loopback' })).trustProxy).toBe('loopback');
    expect(() => parseEnv({ ...REQUIRED, TRUST_PROXY: 'everyone; drop' })).toThrow(/TRUST_PROXY/);
  });
});

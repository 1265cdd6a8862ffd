import { describe, expect, it } from 'vitest';
import { loadConfig } from '../config';
import { contentSecurityPolicy } from './security-headers';

describe('contentSecurityPolicy(config, opts)', () => {
  const config = loadConfig({ S3_ENDPOINT: 'https://objects.example:9000/' });

  it('allows scripts and styles only from our origin, and connections to the object store', () => {
    const csp = contentSecurityPolicy(config);
    expect(csp['script-src']).toEqual(["'self'"]);
    expect(csp['style-src']).toEqual(["'self'"]);
    expect(csp['style-src-attr']).toEqual(["'unsafe-inline'"]);
    expect(csp['connect-src']).toEqual(["'self'", 'https://objects.example:9000']);
    expect(csp['frame-ancestors']).toEqual(["'none'"]);
    expect(csp['object-src']).toEqual(["'none'"]);
    expect(csp['form-action']).toEqual(["'self'"]);
    expect(Object.values(csp).flat()).not.toContain("'unsafe-eval'");
    expect(csp).not.toHaveProperty('upgrade-insecure-requests');
  });

  it('relaxes inline scripts, styles and the HMR socket only for the dev client', () => {
    const dev = contentSecurityPolicy(config, { dev: true });
    expect(dev['script-src']).toContain("'unsafe-inline'");
    expect(dev['connect-src']).toContain('ws:');
    expect(dev['frame-ancestors']).toEqual(["'none'"]);
  });

  it('upgrades insecure requests when the public address is https', () => {
    expect(contentSecurityPolicy(loadConfig({ PUBLIC_BASE_URL: 'https://cohesia.example' }))).toHaveProperty('upgrade-insecure-requests');
  });
});

describe('loadConfig(env) security settings', () => {
  it('keeps rate limits effective by default and practically off in tests unless set', () => {
    expect(loadConfig({}).security.rateLimits).toMatchObject({ signIn: 10, signUp: 5, passwordReset: 5, accessRequests: 20, windowSeconds: 900 });
    expect(loadConfig({ NODE_ENV: 'test' }).security.rateLimits.signIn).toBeGreaterThan(10_000);
    expect(loadConfig({ NODE_ENV: 'test', RATE_LIMIT_SIGN_IN: '3' }).security.rateLimits.signIn).toBe(3);
  });

  it('reads the trust proxy setting as Express expects it', () => {
    expect(loadConfig({}).security.trustProxy).toBe('loopback');
    expect(loadConfig({ TRUST_PROXY: '2' }).security.trustProxy).toBe(2);
    expect(loadConfig({ TRUST_PROXY: 'false' }).security.trustProxy).toBe(false);
    expect(loadConfig({ TRUST_PROXY: '10.0.0.0/8, loopback' }).security.trustProxy).toBe('10.0.0.0/8, loopback');
  });

  it('names a bad limit or body size', () => {
    expect(() => loadConfig({ RATE_LIMIT_SIGN_IN: 'many' })).toThrow(/RATE_LIMIT_SIGN_IN/);
    expect(() => loadConfig({ JSON_BODY_LIMIT: 'huge' })).toThrow(/JSON_BODY_LIMIT/);
  });
});

import { expect } from 'vitest';
import { firstLink, uniqueEmail, type TestApp } from './test-app';
import { httpClient, type HttpClient } from './http-client';

export const PASSWORD = 'a-long-test-password';

/** Signs up through better-auth, follows the verification link from the captured mail, and returns a signed-in client. */
export async function signUpAndVerify(app: TestApp, who: string, email = uniqueEmail(who)): Promise<{ http: HttpClient; email: string }> {
  const http = httpClient(app.url);
  const res = await http.post('/api/auth/sign-up/email', { name: `Test ${who}`, email, password: PASSWORD, callbackURL: '/account' });
  expect(res.status).toBe(200);
  const mail = await app.mail.waitFor(email, /Confirm your e-mail/);
  const verify = await http.get(firstLink(mail.text));
  expect(verify.status).toBe(302);
  expect(http.hasSession()).toBe(true);
  return { http, email };
}

/** Signs in a seeded demo account. */
export async function signInDemo(app: TestApp, email: string): Promise<HttpClient> {
  const http = httpClient(app.url);
  const res = await http.post('/api/auth/sign-in/email', { email, password: 'demo-swarm-2026' });
  expect(res.status).toBe(200);
  return http;
}

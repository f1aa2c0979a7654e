import type { Express } from 'express';
import request from 'supertest';
import { TEST_PASSWORD } from './factories';

export type Agent = ReturnType<typeof request.agent>;

/** A cookie-keeping client with a CSRF token for its session, like a browser tab or a script. */
export interface SessionAgent {
  agent: Agent;
  csrfToken: string;
}

export async function anonymousAgent(app: Express): Promise<SessionAgent> {
  const agent = request.agent(app);
  const response = await agent.get('/api/auth/csrf').expect(200);
  return { agent, csrfToken: response.body.csrfToken as string };
}

export async function signedInAgent(app: Express, email: string, password = TEST_PASSWORD): Promise<SessionAgent> {
  const { agent, csrfToken } = await anonymousAgent(app);
  const response = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrfToken).send({ email, password });
  if (response.status !== 200) throw new Error(`Sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`);
  return { agent, csrfToken: response.body.csrfToken as string };
}

/** The link in a captured e-mail, and the token it carries. */
export function linkIn(text: string): { url: string; token: string } {
  const match = /(https?:\/\/\S+\?token=([A-Za-z0-9_-]+))/.exec(text);
  if (!match) throw new Error(`No link in message:\n${text}`);
  return { url: match[1], token: match[2] };
}

import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import { expect } from 'vitest';
import { ApiClient } from './api-client.ts';

export interface TestAccount {
  client: ApiClient;
  id: number;
  email: string;
  password: string;
  displayName: string;
}

/** A fresh e-mail per call, so tests never collide on the shared database. */
export function uniqueEmail(label = 'user'): string {
  return `${label}-${randomUUID().slice(0, 8)}@ergodic-test.example`;
}

/** Signs a new account up through the API and returns its signed-in client. */
export async function signUp(app: Express, label = 'user'): Promise<TestAccount> {
  const client = await new ApiClient(app).prime();
  const email = uniqueEmail(label);
  const password = `pw-${randomUUID()}`;
  const displayName = `Test ${label}`;
  const res = await client.post('/api/auth/register', { email, password, displayName });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { client, id: res.body.user.id, email, password, displayName };
}

export async function signIn(app: Express, email: string, password: string): Promise<ApiClient> {
  const client = await new ApiClient(app).prime();
  const res = await client.post('/api/auth/login', { email, password });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return client;
}

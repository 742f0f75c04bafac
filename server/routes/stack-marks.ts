import type { RequestHandler } from 'express';
import type { Access } from './route-table.ts';

/**
 * Marks what apiRouter put on its stack, so a test can prove that every
 * route came from the route table with its access guard first, and that no
 * other middleware slipped in.
 */
const guards = new WeakMap<RequestHandler, Access>();
const sharedMiddleware = new WeakSet<RequestHandler>();

export function markGuard(guard: RequestHandler, access: Access): RequestHandler {
  guards.set(guard, access);
  return guard;
}

export function accessOfGuard(handler: unknown): Access | undefined {
  return typeof handler === 'function' ? guards.get(handler as RequestHandler) : undefined;
}

export function markSharedMiddleware(handler: RequestHandler): RequestHandler {
  sharedMiddleware.add(handler);
  return handler;
}

export function isSharedMiddleware(handler: unknown): boolean {
  return typeof handler === 'function' && sharedMiddleware.has(handler as RequestHandler);
}

import type { Express } from 'express';

/** The parts of Express 5's router layers that the stack checks read. */
export interface RawLayer {
  name: string;
  rawPath?: string | string[];
  handle: unknown;
  route?: { path: string; methods: Record<string, boolean>; stack: RawLayer[] };
}

function stackOf(router: unknown): RawLayer[] {
  const stack = (router as { stack?: unknown }).stack;
  if (!Array.isArray(stack)) throw new Error('not an Express router: no stack');
  return stack as RawLayer[];
}

export function appLayers(app: Express): RawLayer[] {
  return stackOf(app.router);
}

export function routerLayers(handle: unknown): RawLayer[] {
  return stackOf(handle);
}

export function isRouter(handle: unknown): boolean {
  return typeof handle === 'function' && Array.isArray((handle as { stack?: unknown }).stack);
}

import { z } from 'zod';

/** Reads an unwrapped value: a shared zod schema, or a hand-written parser for large documents. */
export type ValueReader<T> = z.ZodType<T> | ((value: unknown) => T);

/**
 * Every JSON answer of the API wraps its value in one key — `{projects: [...]}`,
 * `{project: {...}}` — and this is the one place the app takes it out and checks
 * it. Use it as an `httpResource` `parse` or in a `map()` after `HttpClient`.
 */
export function unwrap<T>(key: string, read: ValueReader<T>): (body: unknown) => T {
  return (body: unknown) => {
    if (typeof body !== 'object' || body === null || !(key in body)) {
      throw new Error(`The server's answer has no "${key}" in it; this page cannot read it.`);
    }
    const value: unknown = (body as Record<string, unknown>)[key];
    if (typeof read === 'function') return read(value);
    const parsed = read.safeParse(value);
    if (!parsed.success) {
      const where = parsed.error.issues[0]?.path.join('.') || key;
      throw new Error(`The server's answer came back in a shape this page cannot read (at ${key}.${where}).`);
    }
    return parsed.data;
  };
}

/** `{<plural>: [...]}`: the list under `key`, each item checked. */
export function unwrapList<T>(key: string, item: z.ZodType<T>): (body: unknown) => T[] {
  return unwrap(key, z.array(item));
}

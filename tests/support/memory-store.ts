/** An object store in memory with the calls the frame store uses, counting requests. */
export class MemoryStore {
  readonly objects = new Map<string, Uint8Array>();
  gets = 0;
  ranged = 0;

  async putBytes(key: string, body: Uint8Array): Promise<void> {
    this.objects.set(key, body.slice());
  }

  async getBytes(key: string): Promise<Uint8Array> {
    this.gets++;
    const body = this.objects.get(key);
    if (!body) throw new Error(`no object ${key}`);
    return body.slice();
  }

  async getRange(key: string, start: number, length: number): Promise<Uint8Array> {
    this.ranged++;
    const body = this.objects.get(key);
    if (!body) throw new Error(`no object ${key}`);
    if (start + length > body.length) throw new Error(`range past the end of ${key}`);
    return body.slice(start, start + length);
  }

  async deletePrefix(prefix: string): Promise<number> {
    const keys = [...this.objects.keys()].filter((k) => k.startsWith(prefix));
    for (const k of keys) this.objects.delete(k);
    return keys.length;
  }

  keys(): string[] {
    return [...this.objects.keys()].sort();
  }
}

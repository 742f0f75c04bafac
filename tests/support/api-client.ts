import request from 'supertest';

/** The in-process app, or the base URL of a running server. */
type Target = Parameters<typeof request>[0];

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';
const UNSAFE = new Set<Method>(['post', 'patch', 'put', 'delete']);

/**
 * A caller of the API as the browser app behaves: it keeps cookies and echoes
 * the XSRF-TOKEN cookie in X-XSRF-TOKEN on writes. With a bearer token it
 * behaves like a script instead: no cookies, Authorization header only.
 */
export class ApiClient {
  private readonly agent: ReturnType<typeof request.agent>;
  private xsrf: string | undefined;

  constructor(private readonly app: Target, private readonly bearer?: string) {
    this.agent = request.agent(app);
  }

  static withToken(app: Target, token: string): ApiClient {
    return new ApiClient(app, token);
  }

  /** Reads the XSRF cookie the server hands to every cookie-based caller. */
  async prime(): Promise<this> {
    await this.send('get', '/api/health');
    return this;
  }

  get xsrfToken(): string | undefined {
    return this.xsrf;
  }

  async send(method: Method, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<request.Response> {
    const target = this.bearer ? request(this.app) : this.agent;
    let req = target[method](path);
    if (this.bearer) req = req.set('Authorization', `Bearer ${this.bearer}`);
    else if (UNSAFE.has(method) && this.xsrf) req = req.set('X-XSRF-TOKEN', this.xsrf);
    for (const [name, value] of Object.entries(headers)) req = req.set(name, value);
    const res = body === undefined ? await req : await req.send(body as object);
    this.rememberXsrf(res);
    return res;
  }

  /** A request with this caller's credentials, for multipart bodies and raw responses. */
  raw(method: Method, path: string): request.Test {
    const target = this.bearer ? request(this.app) : this.agent;
    let req = target[method](path);
    if (this.bearer) req = req.set('Authorization', `Bearer ${this.bearer}`);
    else if (UNSAFE.has(method) && this.xsrf) req = req.set('X-XSRF-TOKEN', this.xsrf);
    return req;
  }

  get(path: string) { return this.send('get', path); }
  post(path: string, body?: unknown) { return this.send('post', path, body ?? {}); }
  patch(path: string, body?: unknown) { return this.send('patch', path, body ?? {}); }
  delete(path: string, body?: unknown) { return this.send('delete', path, body); }

  private rememberXsrf(res: request.Response): void {
    const cookies = res.headers['set-cookie'];
    const list = Array.isArray(cookies) ? cookies : cookies ? [cookies] : [];
    for (const cookie of list) {
      const match = /^XSRF-TOKEN=([^;]*)/.exec(cookie);
      if (match && match[1]) this.xsrf = decodeURIComponent(match[1]);
    }
  }
}

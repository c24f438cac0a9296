/** A tiny HTTP client with a cookie jar, for talking to the running test server. */
export const appUrl = process.env.SORTIE_TEST_APP_URL ?? "http://localhost:3100";

export class Client {
  private cookies = new Map<string, string>();
  /** `base` points the client at another app instance (tests/faults run two). */
  constructor(
    private bearer?: string,
    readonly base: string = appUrl,
  ) {}

  /** A client for another instance carrying this one's cookies: the same browser behind a balancer. */
  withBase(base: string): Client {
    const other = new Client(this.bearer, base);
    for (const [k, v] of this.cookies) other.cookies.set(k, v);
    return other;
  }

  /** The jar's cookies, e.g. to hand a signed-in session to a browser. */
  cookieList(): { name: string; value: string }[] {
    return [...this.cookies].map(([name, value]) => ({ name, value }));
  }

  private cookieHeader(): string | undefined {
    if (this.cookies.size === 0) return undefined;
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  async request(path: string, init: RequestInit & { json?: unknown } = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    const cookie = this.cookieHeader();
    if (cookie) headers.set("cookie", cookie);
    if (this.bearer) headers.set("authorization", `Bearer ${this.bearer}`);
    let body = init.body;
    if (init.json !== undefined) {
      headers.set("content-type", "application/json");
      body = JSON.stringify(init.json);
    }
    const res = await fetch(new URL(path, this.base), { ...init, headers, body, redirect: "manual" });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (/max-age=0|expires=Thu, 01 Jan 1970/i.test(c) || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return res;
  }

  get(path: string) {
    return this.request(path);
  }

  post(path: string, json: unknown) {
    return this.request(path, { method: "POST", json });
  }

  /** Signs in through next-auth's credentials flow; returns the error code or null on success. */
  async signIn(email: string, password: string): Promise<string | null> {
    const csrf = (await (await this.get("/api/auth/csrf")).json()) as { csrfToken: string };
    const res = await this.request("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken: csrf.csrfToken, email, password, json: "true", callbackUrl: `${this.base}/dashboard` }).toString(),
    });
    const body = (await res.json().catch(() => ({}))) as { url?: string };
    const error = body.url ? new URL(body.url, this.base).searchParams.get("error") : "no-url";
    if (error) return error;
    return [...this.cookies.keys()].some((k) => k.includes("session-token")) ? null : "no-session-cookie";
  }
}

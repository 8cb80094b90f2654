// A tiny HTTP client for the running app: keeps one session cookie, sends a same-origin header.
import { appUrl } from "./env";

export const demoPassword = "ordwise-demo-2026";
export type DemoRole = "admin" | "engineer" | "technician" | "viewer";

export class Client {
  cookie: string | null = null;

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const res = await fetch(new URL(path, appUrl()), {
      method,
      redirect: "manual",
      headers: {
        origin: appUrl(),
        ...(body !== undefined ? { "content-type": "application/json" } : {}),
        ...(this.cookie ? { cookie: this.cookie } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.getSetCookie();
    for (const c of set) {
      const [pair] = c.split(";");
      if (pair?.startsWith("ordwise_session=")) this.cookie = pair.endsWith("=") ? null : pair;
    }
    return res;
  }

  async signIn(email: string, password = demoPassword): Promise<Response> {
    return this.request("POST", "/api/auth/sign-in", { email, password });
  }
}

export async function signedIn(role: DemoRole): Promise<Client> {
  const c = new Client();
  const res = await c.signIn(`${role}@ordwise.test`);
  if (res.status !== 200) throw new Error(`demo sign-in as ${role} failed with ${res.status}`);
  return c;
}

export interface CaughtMail {
  to: string[];
  subject: string;
  text: string;
}

/** Waits for a message to `to` at the local mail catcher. */
export async function waitForMail(to: string, timeoutMs = 10_000): Promise<CaughtMail> {
  const base = process.env.MAIL_CATCHER_URL!;
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await fetch(new URL(`/messages?to=${encodeURIComponent(to)}`, base));
    const list = (await res.json()) as CaughtMail[];
    if (list[0]) return list[0];
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no e-mail to ${to} within ${timeoutMs} ms`);
}

// A tiny HTTP client for the running app: keeps one session cookie, sends a same-origin header.
import type { CaughtMail } from "@/lib/mail/caught-mail";
import { appUrl } from "./env";
import { pollFor } from "./poll";

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

/** The messages to `to` at the local mail catcher, newest first. */
export async function caughtMail(to: string): Promise<CaughtMail[]> {
  const res = await fetch(new URL(`/messages?to=${encodeURIComponent(to)}`, process.env.MAIL_CATCHER_URL!));
  return (await res.json()) as CaughtMail[];
}

/** Waits for the newest message to `to` that `match` accepts (any message by default). */
export async function waitForMail(to: string, { match = () => true, timeoutMs = 10_000 }: { match?: (mail: CaughtMail) => boolean; timeoutMs?: number } = {}): Promise<CaughtMail> {
  return pollFor(`an e-mail to ${to}`, async () => (await caughtMail(to)).find(match), { timeoutMs });
}

import http from "node:http";
import { describe, expect, it } from "vitest";
import { inject } from "vitest";
import { DEMO_USERS } from "@/scripts/seed/seed-demo";

/**
 * A plain HTTP client against the built app: no browser, only the cookies a script would keep. This is how a
 * stolen or saved cookie would be replayed, and how a guessing script would send its tries.
 */
const base = () => inject("baseURL");

function cookiesOf(res: Response, jar: Map<string, string>): void {
  for (const line of res.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const eq = pair.indexOf("=");
    const value = pair.slice(eq + 1);
    if (value === "" || /max-age=0|expires=thu, 01 jan 1970/i.test(line)) jar.delete(pair.slice(0, eq));
    else jar.set(pair.slice(0, eq), value);
  }
}
const header = (jar: Map<string, string>) => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");

async function authPost(
  jar: Map<string, string>,
  path: string,
  fields: Record<string, string>,
  headers: Record<string, string> = {},
) {
  const csrf = await fetch(`${base()}/api/auth/csrf`, { headers: { cookie: header(jar) } });
  cookiesOf(csrf, jar);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${base()}/api/auth/${path}`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: header(jar), ...headers },
    body: new URLSearchParams({ csrfToken, ...fields }).toString(),
  });
  cookiesOf(res, jar);
  return res;
}

const get = (path: string, cookie: string) => fetch(`${base()}${path}`, { headers: { cookie }, redirect: "manual" });

describe("sessions, sign-in limits and caught mail over plain HTTP", () => {
  it("refuses a session cookie saved before signing out", async () => {
    const user = DEMO_USERS.find((u) => u.role === "specialist")!;
    const jar = new Map<string, string>();
    const signedIn = await authPost(jar, "callback/credentials", {
      email: user.email,
      password: user.password,
      callbackUrl: `${base()}/sites`,
    });
    expect(signedIn.status).toBe(302);
    const saved = [...jar]
      .filter(([k]) => k.includes("session-token"))
      .map(([k, v]) => `${k}=${v}`)
      .join("; ");
    expect(saved).not.toBe("");
    expect((await get("/api/sites", saved)).status).toBe(200);

    await authPost(jar, "signout", { callbackUrl: `${base()}/sign-in` });
    expect((await get("/api/sites", saved)).status).toBe(401);
    const page = await get("/sites", saved);
    expect(page.status).toBeGreaterThanOrEqual(300);
    expect(page.headers.get("location") ?? "").toMatch(/\/sign-in/);
  });

  it("answers guesses sent at once with 429 and Retry-After, and a forged address header gets no fresh tries", async () => {
    const email = `nobody.${Date.now()}@example.org`;
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, k) =>
        authPost(new Map(), "callback/credentials", { email, password: `guess-${k}` }),
      ),
    );
    const refused = answers.filter((r) => r.status === 429);
    expect(refused).toHaveLength(3);
    for (const r of refused) expect(Number(r.headers.get("retry-after"))).toBeGreaterThan(0);
    const forged = await authPost(
      new Map(),
      "callback/credentials",
      { email, password: "guess-9" },
      { "x-forwarded-for": "198.51.100.77", "x-loamwork-peer": "198.51.100.78" },
    );
    expect(forged.status).toBe(429);
  });

  it("counts tries by the address that connected: another local address is not refused, a forged header is", async () => {
    const email = `target.${Date.now()}@example.org`;
    for (let k = 0; k < 6; k++) await authPost(new Map(), "callback/credentials", { email, password: `guess-${k}` });
    expect(
      (
        await authPost(
          new Map(),
          "callback/credentials",
          { email, password: "guess-6" },
          { "x-loamwork-peer": "127.0.0.2" },
        )
      ).status,
    ).toBe(429);
    // The same try from 127.0.0.2, another loopback address of this machine, is checked (a redirect, not 429).
    const jar = new Map<string, string>();
    const csrf = await fetch(`${base()}/api/auth/csrf`);
    cookiesOf(csrf, jar);
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const port = new URL(base()).port;
    const status = await new Promise<number>((resolve, reject) => {
      const body = new URLSearchParams({ csrfToken, email, password: "guess-7" }).toString();
      const req = http.request(
        {
          host: "127.0.0.1",
          port,
          localAddress: "127.0.0.2",
          method: "POST",
          path: "/api/auth/callback/credentials",
          headers: {
            host: `localhost:${port}`,
            "content-type": "application/x-www-form-urlencoded",
            cookie: header(jar),
            "content-length": Buffer.byteLength(body),
          },
        },
        (res) => {
          res.resume();
          resolve(res.statusCode ?? 0);
        },
      );
      req.on("error", reject);
      req.end(body);
    });
    expect(status).toBe(302);
  });

  it("keeps the caught mail, with its reset links, from signed-out visitors and shows it to a signed-in one", async () => {
    const user = DEMO_USERS.find((u) => u.role === "digger")!;
    const asked = await fetch(`${base()}/api/auth-extra/password-reset/request`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: user.email }),
    });
    expect(asked.status).toBe(200);

    const out = await get("/dev/mail", "");
    expect(out.status).toBe(307);
    expect(out.headers.get("location") ?? "").toMatch(/\/sign-in/);
    expect(await out.text()).not.toContain("/reset-password/");

    const jar = new Map<string, string>();
    expect(
      (
        await authPost(jar, "callback/credentials", {
          email: user.email,
          password: user.password,
          callbackUrl: `${base()}/sites`,
        })
      ).status,
    ).toBe(302);
    let body = "";
    for (let i = 0; i < 50 && !body.includes("/reset-password/"); i++) {
      const page = await get("/dev/mail", header(jar));
      expect(page.status).toBe(200);
      body = await page.text();
      if (!body.includes("/reset-password/")) await new Promise((r) => setTimeout(r, 200));
    }
    expect(body).toContain("/reset-password/");
  });
});

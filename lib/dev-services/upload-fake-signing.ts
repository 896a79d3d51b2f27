/**
 * Signing rules of the uploadthing v7 protocol as the SDK applies them (local-services.md, "Uploads"):
 * presigned URLs carry `signature=hmac-sha256=<hex>` over the URL without it, keyed with the apiKey;
 * callbacks carry `x-uploadthing-signature: hmac-sha256=<hex>` over the body.
 */
import { createHmac, timingSafeEqual } from "node:crypto";

/** A fixed token for local development and tests: the SDK only checks its shape (`sk_` key, regions). */
export const FAKE_UPLOADTHING_TOKEN = Buffer.from(
  JSON.stringify({ apiKey: "sk_loamwork_local_fake_0000000000", appId: "loamwork-local", regions: ["local-fake"] }),
).toString("base64");

export type FakeToken = { apiKey: string; appId: string; regions: string[] };

export function parseToken(token: string): FakeToken {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(token, "base64").toString("utf8"));
  } catch {
    throw new Error("upload fake: the token is not base64 of JSON");
  }
  const t = parsed as Partial<FakeToken>;
  if (typeof t.apiKey !== "string" || !t.apiKey.startsWith("sk_"))
    throw new Error("upload fake: the token's apiKey must start with sk_");
  if (typeof t.appId !== "string" || !Array.isArray(t.regions) || t.regions.length === 0)
    throw new Error("upload fake: the token needs appId and regions");
  return t as FakeToken;
}

export function sign(payload: string, apiKey: string): string {
  return `hmac-sha256=${createHmac("sha256", apiKey).update(payload).digest("hex")}`;
}

export function sameSignature(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

export type PresignedCheck =
  { ok: true; key: string; params: URLSearchParams } | { ok: false; status: 400 | 403; error: string };

/**
 * Verifies a presigned URL as received: `base` is scheme + host the client addressed, `pathAndQuery` the
 * raw request target. The signature is the last parameter; everything before it was signed.
 */
export function checkPresigned(base: string, pathAndQuery: string, token: FakeToken, now = Date.now()): PresignedCheck {
  const checked = checkSignature(base, pathAndQuery, token, now, "upload URL");
  if (!checked.ok) return checked;
  const { url } = checked;
  if (url.searchParams.get("x-ut-identifier") !== token.appId)
    return { ok: false, status: 403, error: "The upload URL names another app." };
  const key = decodeURIComponent(url.pathname.slice(1));
  if (!key || key.includes("/")) return { ok: false, status: 400, error: "The upload URL names no file key." };
  return { ok: true, key, params: url.searchParams };
}

/**
 * The signature and expiry of a URL signed with the apiKey (`expires=<ms>&…&signature=hmac-sha256=<hex>` as
 * the SDK's generateSignedURL writes it); `what` names the URL in the refusal.
 */
export function checkSignature(
  base: string,
  pathAndQuery: string,
  token: FakeToken,
  now: number,
  what: string,
): { ok: true; url: URL } | { ok: false; status: 403; error: string } {
  const at = pathAndQuery.lastIndexOf("&signature=");
  if (at < 0) return { ok: false, status: 403, error: `The ${what} carries no signature.` };
  const signed = base + pathAndQuery.slice(0, at);
  const given = decodeURIComponent(pathAndQuery.slice(at + "&signature=".length));
  if (!sameSignature(given, sign(signed, token.apiKey)))
    return {
      ok: false,
      status: 403,
      error: `The ${what}'s signature does not match (tampered or signed with another key).`,
    };
  const url = new URL(signed);
  const expires = Number(url.searchParams.get("expires"));
  if (!Number.isFinite(expires) || expires < now) return { ok: false, status: 403, error: `The ${what} has expired.` };
  return { ok: true, url };
}

/**
 * A stored file's key from a file URL: `/f/<key>` or, as generateSignedURL writes it with the app id in
 * the path, `/a/<appId>/<key>`. Null for any other path or another app's id.
 */
export function fileKeyOf(pathname: string, token: FakeToken): string | null {
  const m = /^\/(?:f|a\/([^/]+))\/([^/]+)$/.exec(pathname);
  if (!m || (m[1] !== undefined && decodeURIComponent(m[1]) !== token.appId)) return null;
  return decodeURIComponent(m[2]);
}

/** `x-ut-*` values are URI-encoded once by the SDK before URLSearchParams encodes them again. */
export function utParam(params: URLSearchParams, name: string): string | undefined {
  const raw = params.get(name);
  return raw == null ? undefined : decodeURIComponent(raw);
}

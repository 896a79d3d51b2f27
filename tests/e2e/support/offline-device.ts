/** What the offline browser tests share: the network switched off, a page kept on the device, a trench's context. */
import type { BrowserContext, CDPSession, Page } from "playwright-core";

/**
 * The network off (or on again) for every page of the context, through the DevTools protocol. One session
 * per page: conditions set through one session stay in force until that same session lifts them.
 */
const sessions = new WeakMap<Page, CDPSession>();
export async function networkOff(context: BrowserContext, page: Page, off: boolean) {
  await context.setOffline(off);
  const cdp = sessions.get(page) ?? (await context.newCDPSession(page));
  sessions.set(page, cdp);
  await cdp.send("Network.emulateNetworkConditions", {
    offline: off,
    latency: 0,
    downloadThroughput: -1,
    uploadThroughput: -1,
  });
}

/** Waits until the service worker controls the page and keeps its address (on the app at `origin`) cached. */
export async function keptOnDevice(page: Page, url: string, origin: string) {
  await page.waitForFunction(() => Boolean(navigator.serviceWorker?.controller), null, { timeout: 45_000 });
  await page.waitForFunction(
    async (u) => Boolean(await (await caches.open("loamwork-pages")).match(u, { ignoreVary: true })),
    new URL(url, origin).href,
    { timeout: 45_000 },
  );
}

/** The first context of the trench, as the contexts API lists them. */
export async function trenchContextId(page: Page, t: { siteId: string; trenchId: string }) {
  const list = (await (await page.request.get(`/api/sites/${t.siteId}/contexts?trenchId=${t.trenchId}`)).json()) as {
    id: string;
  }[];
  return list[0]!.id;
}

import type { Page } from "playwright-core";
import { DEMO_USERS } from "@/lib/demo-users";

/**
 * Signs a benchmark's or a screenshot run's page in through the real form as one of the demo users and waits
 * for the sites list (the browser tests use it too, through tests/e2e/support/browser.ts).
 */
export async function signInDemo(page: Page, role: (typeof DEMO_USERS)[number]["role"]): Promise<void> {
  const user = DEMO_USERS.find((u) => u.role === role)!;
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(user.email);
  await page.getByLabel("Password").fill(user.password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL("**/sites");
}

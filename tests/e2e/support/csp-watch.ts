import type { BrowserContext } from "playwright-core";

/**
 * Content Security Policy violations reported by any page of the browser tests. Every context opened
 * through openBrowser is watched; tests/e2e/support/csp-setup.ts fails the test that saw one.
 */
const violations: string[] = [];
const MARK = "[loamwork] CSP violation:";

/** Reports each `securitypolicyviolation` event to the console, where the context's listener collects it. */
const reportViolations = `document.addEventListener("securitypolicyviolation", (e) => {
  console.error(${JSON.stringify(MARK)} + " " + e.effectiveDirective + " blocked " + (e.blockedURI || "inline") + " in " + e.sourceFile + ":" + e.lineNumber + (e.sample ? " — " + e.sample : ""));
}, true);`;

export async function watchCsp(context: BrowserContext): Promise<void> {
  await context.addInitScript(reportViolations);
  context.on("console", (msg) => {
    if (msg.type() !== "error") return;
    const text = msg.text();
    // Chromium also logs each refusal itself ("… violates the following Content Security Policy directive …").
    if (text.startsWith(MARK) || /Content Security Policy/i.test(text))
      violations.push(`${msg.location().url || "(page)"}: ${text}`);
  });
}

/** The violations seen since the last call, which forgets them. */
export function takeCspViolations(): string[] {
  return violations.splice(0);
}

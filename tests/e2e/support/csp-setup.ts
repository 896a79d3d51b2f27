import { afterEach } from "vitest";
import { takeCspViolations } from "./csp-watch";

/** Every browser test fails when a page it drove reported a Content Security Policy violation. */
afterEach(() => {
  const seen = takeCspViolations();
  if (seen.length)
    throw new Error(`The page reported ${seen.length} Content Security Policy violation(s):\n${seen.join("\n")}`);
});

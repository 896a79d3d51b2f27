/**
 * Runs once when the server process starts: open the database and start the analysis-run queue, which
 * re-queues runs a stopped process left behind, so they finish without anyone having to open Patterns.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { ensureRunner } = await import("@/lib/server/jobs/runner");
  try {
    await ensureRunner();
  } catch (err) {
    console.error("[loamwork] the analysis-run queue did not start; runs will start it on first use", err);
  }
}

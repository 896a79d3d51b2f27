/**
 * Runs once when the server process starts: open the database and start the analysis-run queue, which
 * re-queues runs a stopped process left behind, so they finish without anyone having to start a new one.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { runQueue } = await import("@/lib/server/jobs/run-queue");
  try {
    await runQueue();
  } catch (err) {
    console.error("[loamwork] the analysis-run queue did not start; the next run will start it", err);
  }
}

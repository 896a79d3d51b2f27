/**
 * Runs once when the server process starts: note each request's client address, and start the analysis-run
 * and package queues, which re-queue runs and packages a stopped process left behind, so they finish without
 * anyone having to start a new one.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  // Before the first request: sign-in limits need the address each request connected from.
  const { stampPeerAddresses } = await import("@/lib/server/peer-stamp");
  stampPeerAddresses();
  const { runQueue } = await import("@/lib/server/jobs/run-queue");
  try {
    await runQueue();
  } catch (err) {
    console.error("[loamwork] the analysis-run queue did not start; the next run will start it", err);
  }
  const { packageQueue } = await import("@/lib/server/jobs/package-queue");
  try {
    await packageQueue();
  } catch (err) {
    console.error("[loamwork] the package queue did not start; the next package will start it", err);
  }
}

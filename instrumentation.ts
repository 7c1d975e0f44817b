/** Runs once when the server starts: a bad environment stops the start with a clear message; then housekeeping begins. */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { checkEnvOrExit } = await import("./lib/server/check-env");
    await checkEnvOrExit();
    if (process.env.NEXT_PHASE !== "phase-production-build") {
      const { startPeriodicJobs } = await import("./lib/server/periodic");
      startPeriodicJobs();
    }
  }
}

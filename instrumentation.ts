/** Runs once when the server starts: a bad environment stops the start with a clear message. */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { checkEnvOrExit } = await import("./lib/server/check-env");
    await checkEnvOrExit();
  }
}

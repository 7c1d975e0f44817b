/** Loads the validated environment; on failure prints which variables are wrong and exits (Node.js runtime only). */
export async function checkEnvOrExit(): Promise<void> {
  try {
    await import("@/lib/env");
  } catch (e) {
    console.error(`\nYawpoint cannot start.\n${e instanceof Error ? e.message : String(e)}\n`);
    process.exit(1);
  }
}

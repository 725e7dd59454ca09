/**
 * Runs once when the server starts (Next.js instrumentation hook): the upload check's worker
 * thread is started now, not by the first upload (loading it takes about a second).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { warmDecodeThread } = await import("@/lib/api/decode-thread");
  warmDecodeThread();
}

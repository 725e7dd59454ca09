import os from "node:os";
import { serverEnv } from "./env";

/** Typed limits and job settings, from the environment with defaults. */
export type UploadLimits = { maxBytes: number; maxDurationSec: number };

export function uploadLimits(): UploadLimits {
  const env = process.env;
  const maxMb = Number(env.UPLOAD_MAX_MB ?? 200);
  const maxMin = Number(env.UPLOAD_MAX_MINUTES ?? 30);
  return {
    maxBytes: Math.round((Number.isFinite(maxMb) && maxMb > 0 ? maxMb : 200) * 1024 * 1024),
    maxDurationSec: (Number.isFinite(maxMin) && maxMin > 0 ? maxMin : 30) * 60,
  };
}

export type JobConfig = { concurrency: number; maxAttempts: number; leaseMs: number; pollMs: number };

export function jobConfig(): JobConfig {
  const env = process.env;
  const wanted = Number(env.JOB_CONCURRENCY);
  return {
    // default: one core left for the web server, at least one worker
    concurrency: Number.isInteger(wanted) && wanted > 0 ? wanted : Math.max(1, os.availableParallelism() - 1),
    maxAttempts: Number(env.JOB_MAX_ATTEMPTS ?? 3),
    leaseMs: Number(env.JOB_LEASE_MS ?? 30_000),
    pollMs: Number(env.JOB_POLL_MS ?? 500),
  };
}

export function dataDir(): string {
  return serverEnv().DATA_DIR;
}

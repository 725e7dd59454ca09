import { Worker, type WorkerOptions } from "node:worker_threads";

/**
 * A worker thread running a TypeScript module. Worker threads do not inherit tsx's module hooks
 * on Node.js 20, so the thread registers them itself (tsx's `tsImport`) before loading the
 * module; `--conditions=react-server` keeps module resolution the same as in the server and
 * the job runner. Used by the job runner's analysis threads and the upload check's thread.
 */
export function spawnTsWorker(entryUrl: string, options: Omit<WorkerOptions, "eval" | "execArgv"> = {}): Worker {
  const code = `import { tsImport } from "tsx/esm/api";\nawait tsImport(${JSON.stringify(entryUrl)}, ${JSON.stringify(entryUrl)});\n`;
  return new Worker(code, { ...options, eval: true, execArgv: ["--conditions=react-server"] });
}

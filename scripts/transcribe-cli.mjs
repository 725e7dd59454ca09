/**
 * `npm run transcribe`: runs the Tapernote command line (scripts/transcribe.ts) from a bundle of
 * its own sources that esbuild writes on first use, and again whenever one of them is newer
 * (the sources it read are listed beside the bundle). Loading TypeScript through tsx's hooks
 * cost about 0.6 s of start-up per run, a tenth of a 10-minute take's analysis; the packages
 * stay outside the bundle and load from node_modules as usual.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const cacheDir = path.join(root, "node_modules", ".cache", "tapernote");
const bundle = path.join(cacheDir, "transcribe.mjs");
const inputsFile = path.join(cacheDir, "transcribe.inputs.json");

function fresh() {
  if (!existsSync(bundle) || !existsSync(inputsFile)) return false;
  const builtMs = statSync(bundle).mtimeMs;
  try {
    const inputs = JSON.parse(readFileSync(inputsFile, "utf8"));
    return inputs.every((file) => statSync(path.join(root, file)).mtimeMs <= builtMs);
  } catch {
    return false; // a source moved or the list is damaged: build again
  }
}

if (!fresh()) {
  const { build } = await import("esbuild");
  const result = await build({
    absWorkingDir: root,
    entryPoints: ["scripts/transcribe.ts"],
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    packages: "external",
    tsconfig: "tsconfig.json",
    write: false,
    metafile: true,
    logLevel: "error",
  });
  mkdirSync(cacheDir, { recursive: true });
  // written aside and renamed, so runs started together never read half a bundle
  const tmp = `${bundle}.${process.pid}.tmp`;
  writeFileSync(tmp, result.outputFiles[0].contents);
  renameSync(tmp, bundle);
  const tmpInputs = `${inputsFile}.${process.pid}.tmp`;
  writeFileSync(tmpInputs, JSON.stringify(Object.keys(result.metafile.inputs)));
  renameSync(tmpInputs, inputsFile);
}

await import(pathToFileURL(bundle).href);

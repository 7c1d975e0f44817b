// node experiments/cli/run.mjs NAME [args…] — runs experiments/cli/NAME.ts from a bundle.
// Starting a CLI through tsx costs 0.5–0.8 s here (its loader transpiles every imported file on
// each start); this launcher bundles the CLI once with esbuild (the transpiler tsx itself uses)
// into node_modules/.cache/yawpoint-cli/NAME.mjs (git-ignored), npm packages left as imports, and
// rebuilds it whenever one of the bundled project files is newer than the bundle. Behaviour, flags,
// output and exit codes are the CLI's own: the bundle is the same code.
import { mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..");
const name = process.argv[2];
if (!name || !/^[a-z][a-z-]*$/.test(name)) {
  process.stderr.write("usage: node experiments/cli/run.mjs NAME [args…]\n");
  process.exit(2);
}
const entry = join(root, "experiments", "cli", `${name}.ts`);
const cache = join(root, "node_modules", ".cache", "yawpoint-cli");
const bundle = join(cache, `${name}.mjs`);
const inputsFile = join(cache, `${name}.inputs.json`);

/** Whether the bundle exists and no input (as esbuild listed them) changed after it was written. */
function fresh() {
  let built;
  try {
    built = statSync(bundle).mtimeMs;
    const inputs = JSON.parse(readFileSync(inputsFile, "utf8"));
    for (const input of inputs) if (statSync(join(root, input)).mtimeMs > built) return false;
    return true;
  } catch {
    return false;
  }
}

if (!fresh()) {
  const { build } = await import("esbuild");
  mkdirSync(cache, { recursive: true });
  const tmp = `${bundle}.${process.pid}.tmp`;
  const result = await build({
    entryPoints: [entry],
    outfile: tmp,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    packages: "external",
    metafile: true,
    absWorkingDir: root,
    logLevel: "error",
  });
  const inputs = Object.keys(result.metafile.inputs).filter((p) => !p.startsWith("node_modules/"));
  writeFileSync(`${inputsFile}.${process.pid}.tmp`, JSON.stringify(inputs));
  // rename is atomic: a CLI started meanwhile sees the old bundle or the new one, never half of one.
  renameSync(`${inputsFile}.${process.pid}.tmp`, inputsFile);
  renameSync(tmp, bundle);
}
// The CLI reads its arguments from process.argv.slice(2), as when run directly.
process.argv.splice(2, 1);
await import(pathToFileURL(bundle).href);

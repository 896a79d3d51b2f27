// Types with `noUncheckedIndexedAccess` on, for the folders where a missing element is a real case to handle
// (`npm run typecheck:index`, run by `npm test`). TypeScript sets the flag per program, not per folder, so this
// checks the whole project with the flag on and fails on errors inside the folders listed here only.
// The engine (lib/spatial) stays out: its typed-array loops index within bounds they have just checked, and
// its benchmark is the measure of its code, not this flag. Add a folder here once it is clean.
import path from "node:path";
import ts from "typescript";

const CHECKED = ["lib/geometry/"];

const root = process.cwd();
const configPath = ts.findConfigFile(root, ts.sys.fileExists, "tsconfig.json");
if (!configPath) throw new Error("tsconfig.json not found");
const config = ts.readConfigFile(configPath, ts.sys.readFile);
const parsed = ts.parseJsonConfigFileContent(config.config, ts.sys, root);
const program = ts.createProgram({
  rootNames: parsed.fileNames,
  options: { ...parsed.options, noUncheckedIndexedAccess: true, noEmit: true, incremental: false },
});
const inScope = (file) => CHECKED.some((dir) => path.relative(root, file.fileName).split(path.sep).join("/").startsWith(dir));
const diagnostics = program.getSourceFiles().filter(inScope).flatMap((f) => [...program.getSemanticDiagnostics(f), ...program.getSyntacticDiagnostics(f)]);
if (diagnostics.length > 0) {
  const host = { getCanonicalFileName: (f) => f, getCurrentDirectory: () => root, getNewLine: () => "\n" };
  process.stderr.write(ts.formatDiagnostics(diagnostics, host));
  process.stderr.write(`\n${diagnostics.length} unchecked index access error(s) in ${CHECKED.join(", ")}.\n`);
  process.exit(1);
}
console.log(`Index access checked in ${CHECKED.join(", ")}: no errors.`);

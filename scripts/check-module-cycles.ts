// Fails when server modules import each other in a circle. ESLint's import-x/no-cycle sees files; a circle
// between modules can pass through different files (cases/x → triage/y → cases/z), type imports included,
// so this looks at the graph of modules: server/modules/<name>/** collapsed to <name>.
import { readdirSync, readFileSync } from "node:fs";
import { dirname, join, relative, resolve, sep } from "node:path";
import ts from "typescript";
import { projectRoot } from "./lib/paths.js";

const modulesDir = join(projectRoot, "server", "modules");

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) =>
    entry.isDirectory() ? filesUnder(join(dir, entry.name)) : entry.name.endsWith(".ts") ? [join(dir, entry.name)] : [],
  );
}

const moduleOf = (file: string): string | null => {
  const rel = relative(modulesDir, file);
  return rel.startsWith("..") ? null : rel.split(sep)[0];
};

const edges = new Map<string, Map<string, string>>(); // module → (module it imports → one file that does)
for (const file of filesUnder(modulesDir)) {
  const from = moduleOf(file)!;
  for (const { fileName } of ts.preProcessFile(readFileSync(file, "utf8"), true, true).importedFiles) {
    if (!fileName.startsWith(".")) continue;
    const to = moduleOf(resolve(dirname(file), fileName));
    if (!to || to === from) continue;
    if (!edges.has(from)) edges.set(from, new Map());
    if (!edges.get(from)!.has(to)) edges.get(from)!.set(to, relative(projectRoot, file));
  }
}

// Depth-first search for back edges; each circle is reported once, by its members in order.
const cycles = new Set<string>();
const state = new Map<string, "open" | "done">();
const path: string[] = [];
function visit(node: string): void {
  state.set(node, "open");
  path.push(node);
  for (const next of edges.get(node)?.keys() ?? []) {
    if (state.get(next) === "open") {
      const circle = path.slice(path.indexOf(next));
      const start = circle.indexOf([...circle].sort()[0]);
      const ordered = [...circle.slice(start), ...circle.slice(0, start)];
      cycles.add(
        [...ordered, ordered[0]]
          .map((m, i, all) => (i < all.length - 1 ? `${m} (${edges.get(m)!.get(all[i + 1])})` : m))
          .join(" → "),
      );
    } else if (!state.has(next)) visit(next);
  }
  path.pop();
  state.set(node, "done");
}
for (const node of [...edges.keys()].sort()) if (!state.has(node)) visit(node);

if (cycles.size > 0) {
  console.error(`Server modules import each other in a circle (${cycles.size}):`);
  for (const cycle of cycles) console.error(`  ${cycle}`);
  console.error("Break it: the module that needs the other calls its service; the other must not import back.");
  process.exit(1);
}
console.log(`No circles among ${edges.size} importing server modules.`);

import { readdirSync, readFileSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { ROOT } from "../helpers/cli.js";

/** Value imports between src/ modules ("import type" is erased at build and cannot form a cycle at run time). */
function importGraph(): Map<string, string[]> {
  const src = join(ROOT, "src");
  const files: string[] = [];
  const visit = (d: string): void => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      if (e.isDirectory()) visit(join(d, e.name));
      else if (e.name.endsWith(".ts")) files.push(join(d, e.name));
    }
  };
  visit(src);
  const graph = new Map<string, string[]>();
  const spec = /^\s*(?:import|export)\s+(?!type\b)(?:[^"';]*?\sfrom\s+)?["'](\.{1,2}\/[^"']+)["']/gm;
  for (const f of files) {
    const text = readFileSync(f, "utf8");
    const deps: string[] = [];
    for (const m of text.matchAll(spec)) deps.push(relative(src, resolve(dirname(f), m[1]!.replace(/\.js$/, ".ts"))));
    graph.set(relative(src, f), deps);
  }
  return graph;
}

/** One cycle of the graph as a list of modules, or undefined (depth-first search, three colours). */
function findCycle(graph: Map<string, string[]>): string[] | undefined {
  const state = new Map<string, 1 | 2>();
  const path: string[] = [];
  const dfs = (n: string): string[] | undefined => {
    state.set(n, 1);
    path.push(n);
    for (const d of graph.get(n) ?? []) {
      if (state.get(d) === 1) return [...path.slice(path.indexOf(d)), d];
      if (state.get(d) === undefined) {
        const c = dfs(d);
        if (c !== undefined) return c;
      }
    }
    path.pop();
    state.set(n, 2);
    return undefined;
  };
  for (const n of graph.keys()) {
    if (state.get(n) === undefined) {
      const c = dfs(n);
      if (c !== undefined) return c;
    }
  }
  return undefined;
}

describe("imports flow one way", () => {
  it("no module of src/ imports itself through a chain of value imports (e.g. materials/registry ↔ spec)", () => {
    const graph = importGraph();
    expect(graph.size).toBeGreaterThan(100);
    expect(graph.get("materials/registry.ts")?.includes("materials/spec.ts") ?? false).toBe(false);
    expect(findCycle(graph)).toBeUndefined();
  });
});

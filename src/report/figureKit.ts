/** What every figure of the report shares: its record, ids and the azimuth note. */
import type { StackEntry } from "./inputs.js";

export interface Figure {
  /** File-safe id: the SVG is written as <id>.svg. */
  id: string;
  title: string;
  svg: string;
}

/** A figure whose plot carries the same id and title as the figure itself. */
export function figure<O extends { id: string; title: string }>(id: string, title: string, plot: (o: O) => string, rest: Omit<O, "id" | "title">): Figure {
  return { id, title, svg: plot({ id, title, ...rest } as O) };
}

/** How the azimuths of a matrix were combined, for plot subtitles. */
export function phiNote(m: StackEntry["matrix"]): string {
  return m.phiMode === "averaged" ? "azimuth-averaged" : `mean over φ = ${m.phiDeg.join(", ")}°`;
}

/** Lower-case ASCII slug for file names (user text never reaches a path unfiltered). */
export function slug(text: string): string {
  const s = text.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 40);
  return s || "x";
}

/** Plot-id part of a stack: position, study name and (when swept) its combination folder. */
export function stackId(stack: StackEntry, index: number): string {
  const swept = stack.comboKey !== "base" && Object.keys(stack.combo).length > 0;
  return `${index + 1}-${slug(stack.studyName).slice(0, 32)}${swept ? `-${slug(stack.comboKey)}` : ""}`;
}


import { line } from "d3-shape";
import { escapeText } from "../escape.js";

/** Attribute values: numbers are rounded to 0.01 px to keep files small; text is escaped. */
export type Attrs = Record<string, string | number | undefined>;

export function num(v: number): string {
  return String(Math.round(v * 100) / 100);
}

function attrText(attrs: Attrs): string {
  let out = "";
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined) continue;
    out += ` ${k}="${typeof v === "number" ? num(v) : escapeText(v)}"`;
  }
  return out;
}

/** An SVG element; `children` is trusted markup (already built by these helpers). */
export function el(name: string, attrs: Attrs, children?: string): string {
  return children === undefined ? `<${name}${attrText(attrs)}/>` : `<${name}${attrText(attrs)}>${children}</${name}>`;
}

/** A text element; the content is escaped. */
export function text(x: number, y: number, content: string, attrs: Attrs = {}): string {
  return el("text", { x, y, ...attrs }, escapeText(content));
}

/** Polyline path through the points (d3-shape's line), breaking at non-finite values. */
export function pathThrough(xs: ArrayLike<number>, ys: ArrayLike<number>): string {
  const points = Array.from({ length: xs.length }, (_, i) => [xs[i]!, ys[i]!] as [number, number]);
  return (
    line()
      .defined(([x, y]) => Number.isFinite(x) && Number.isFinite(y))
      .x(([x]) => Math.round(x * 100) / 100)
      .y(([, y]) => Math.round(y * 100) / 100)(points) ?? ""
  );
}

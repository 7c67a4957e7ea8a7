import type { StackSpec } from "./stackTypes.js";
import { parseFieldPath } from "./sweepCombos.js";

/** Unit suffixes of field names and how a value is written with them. */
const UNITS: [suffix: string, unit: string, spaced: boolean][] = [
  ["Um", "µm", true],
  ["Nm", "nm", true],
  ["Deg", "°", false],
];

/** "facetAngleDeg" → { quantity: "facet angle", unit: "°" }; "reflectance" → { "reflectance", "" }. */
function quantityOf(key: string): { quantity: string; unit: string; spaced: boolean } {
  for (const [suffix, unit, spaced] of UNITS) {
    if (key.endsWith(suffix) && key.length > suffix.length) {
      return { quantity: words(key.slice(0, -suffix.length)), unit, spaced };
    }
  }
  return { quantity: words(key), unit: "", spaced: false };
}

const words = (camel: string): string => camel.replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase();

/** The thing a swept field belongs to, named as an engineer would: "SiNx", "cover glass", "front texture". */
function subjectOf(stack: StackSpec | undefined, segs: (string | number)[]): string {
  if (stack === undefined) return pathWords(segs);
  const [head, i, sub, j] = segs;
  if (head === "absorber") return stack.absorber.material;
  if (head === "layers" && typeof i === "number") {
    const layer = stack.layers[i];
    if (layer === undefined) return `layer ${i + 1}`;
    if (sub === "topFilms" && typeof j === "number") return `${layer.topFilms[j]?.material ?? "film"} on ${layer.name}`;
    return layer.name;
  }
  if (head === "rearLayers" && typeof i === "number") {
    const layer = stack.rearLayers?.[i];
    if (layer === undefined) return `rear layer ${i + 1}`;
    if (sub === "bottomFilms" && typeof j === "number") return `${layer.bottomFilms[j]?.material ?? "film"} under ${layer.name}`;
    return layer.name;
  }
  if ((head === "front" || head === "rear") && i === "films" && typeof sub === "number") {
    const films = head === "front" ? stack.front.films : "films" in stack.rear ? stack.rear.films : [];
    return `${head} ${films[sub]?.material ?? "film"}`.replace(/^front /, "");
  }
  if ((head === "front" || head === "rear") && i === "texture") return `${head} texture`;
  if (head === "rear" && i === "ideal") return "rear reflector";
  return segs.filter((s) => typeof s === "string").slice(0, -1).join(" ");
}

/** Without the stack: the path in words, "front.films[0]" → "front film 1". */
function pathWords(segs: (string | number)[]): string {
  const words: string[] = [];
  for (const s of segs.slice(0, -1)) {
    if (typeof s === "number") words[words.length - 1] = `${words[words.length - 1]!.replace(/s$/, "")} ${s + 1}`;
    else words.push(s.replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase());
  }
  return words.join(" ");
}

/**
 * A sweep parameter in words with its unit: ("absorber.thicknessUm", 180) → "Si 180 µm",
 * ("front.films[0].thicknessNm", 65) → "SiNx 65 nm", ("front.texture.facetAngleDeg", 50) →
 * "front texture facet angle 50°". Thicknesses need no quantity word; other fields say theirs.
 */
export function parameterLabel(field: string, value: number, stack?: StackSpec): string {
  const segs = parseFieldPath(field, field);
  const key = String(segs[segs.length - 1]);
  const { quantity, unit, spaced } = quantityOf(key);
  const amount = `${value}${unit === "" ? "" : spaced ? ` ${unit}` : unit}`;
  const subject = subjectOf(stack, segs);
  return quantity === "thickness" ? `${subject} ${amount}` : `${subject} ${quantity} ${amount}`.trim();
}

/** A combination's values in words, "Si 180 µm · SiNx 65 nm" (the sweep's field order); without the stack, "absorber 180 µm · front film 1 65 nm". */
export function comboTitle(values: Record<string, number>, stack?: StackSpec): string {
  return Object.entries(values).map(([field, v]) => parameterLabel(field, v, stack)).join(" · ");
}

import { isIdealRear, type StackSpec } from "../study/stackTypes.js";

/**
 * Channel names of a stack, in the order light meets them: R, per thick layer its top films and
 * its bulk, front films, the absorber, rear films, per rear layer its bulk and its bottom films,
 * A_rear (metal exit, ideal reflector or back-sheet), T (escape behind the rear), unresolved. Every stack has R, T,
 * A_absorber, A_rear and unresolved (some may stay zero), so names do not depend on the wavelength.
 */
export function channelNamesOfStack(stack: StackSpec): string[] {
  const names = ["R"];
  for (const layer of stack.layers) {
    layer.topFilms.forEach((f, i) => names.push(`A_film:top:${layer.name}:${i}:${f.material}`));
    names.push(`A_layer:${layer.name}`);
  }
  stack.front.films.forEach((f, i) => names.push(`A_film:front:${i}:${f.material}`));
  names.push("A_absorber");
  if (!isIdealRear(stack.rear)) stack.rear.films.forEach((f, i) => names.push(`A_film:rear:${i}:${f.material}`));
  for (const layer of stack.rearLayers ?? []) {
    names.push(`A_layer:${layer.name}`);
    layer.bottomFilms.forEach((f, i) => names.push(`A_film:bottom:${layer.name}:${i}:${f.material}`));
  }
  names.push("A_rear", "T", "unresolved");
  return names;
}

/** Channel names of a compiled stack, a Study or a StackSpec. */
export function channelNames(x: { channels: string[] } | { stack: StackSpec } | StackSpec): string[] {
  if ("channels" in x) return x.channels.slice();
  if ("stack" in x) return channelNamesOfStack(x.stack);
  return channelNamesOfStack(x);
}

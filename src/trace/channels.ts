import { isIdealRear, type StackSpec } from "../study/stackTypes.js";

/**
 * Light leaving the stack is split by face and by history (README "Where the light goes"): `R_*`
 * leaves through the front (into the incidence medium), `T_*` through the rear (into the medium
 * behind it). `_first` = left at its first arrival at that face; `_escape` = everything later. For
 * light from the front: R_first was reflected without ever entering the absorber (cover layers,
 * films, front interface: the anti-reflection loss), R_escape entered and came back out (the
 * light-trapping loss), T_first crossed once and left at the end of the first pass, T_escape was
 * turned back inside at least once first. For light from the rear the faces swap roles: T_first is
 * the rear reflection before entering, R_first the light through after one pass.
 */
export const CH_R_FIRST = "R_first";
export const CH_R_ESCAPE = "R_escape";
export const CH_T_FIRST = "T_first";
export const CH_T_ESCAPE = "T_escape";

/**
 * Channel names of a stack, in the order light meets them: R_first, R_escape, per thick layer its
 * top films and its bulk, front films, the absorber, rear films, per rear layer its bulk and its
 * bottom films, A_rear (metal exit, ideal reflector or back-sheet), T_first, T_escape, unresolved.
 * Every stack has the R and T pairs, A_absorber, A_rear and unresolved (some may stay zero), so
 * names do not depend on the wavelength.
 */
export function channelNamesOfStack(stack: StackSpec): string[] {
  const names = [CH_R_FIRST, CH_R_ESCAPE];
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
  names.push("A_rear", CH_T_FIRST, CH_T_ESCAPE, "unresolved");
  return names;
}

/** Channel names of a compiled stack, a Study or a StackSpec. */
export function channelNames(x: { channels: string[] } | { stack: StackSpec } | StackSpec): string[] {
  if ("channels" in x) return x.channels.slice();
  if ("stack" in x) return channelNamesOfStack(x.stack);
  return channelNamesOfStack(x);
}

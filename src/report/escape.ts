/**
 * Escapes text for HTML and SVG (XML) text content and double- or single-quoted attribute values.
 * Every piece of user-supplied text (study, stack, material and site names, file paths) passes through
 * here before it reaches the page. The five characters are those XML 1.0 §2.4 / HTML5 §13.1.4 name.
 */
export function escapeText(text: unknown): string {
  return String(text)
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&#39;");
}

/** Tagged template: interpolated values are escaped, the literal parts are trusted markup. */
export function html(strings: TemplateStringsArray, ...values: unknown[]): string {
  let out = strings[0] ?? "";
  for (let i = 0; i < values.length; i++) out += escapeText(values[i]) + (strings[i + 1] ?? "");
  return out;
}

/** JSON indented by two spaces, with arrays of plain numbers/strings kept on one line (readable sidecars). */
export function compactJson(value: unknown): string {
  const text = JSON.stringify(value, null, 2);
  // An array whose body holds no brackets or braces is a flat list: join its lines.
  return text.replace(/\[\n\s+([^[\]{}]*?)\n\s*\]/g, (_, body: string) => `[${body.split(/,\n\s+/).join(", ")}]`) + "\n";
}

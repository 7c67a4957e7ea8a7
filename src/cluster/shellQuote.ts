/**
 * Quotes one word for a POSIX shell: safe words stay as they are, anything else goes inside single
 * quotes with each embedded single quote written as '\'' (POSIX.1-2017, Shell Command Language §2.2.3).
 */
export function shellQuote(word: string): string {
  if (word !== "" && /^[A-Za-z0-9_@%+=:,./-]+$/.test(word)) return word;
  return `'${word.replace(/'/g, `'\\''`)}'`;
}

/** Quotes every word and joins them with single spaces. */
export function shellJoin(words: readonly string[]): string {
  return words.map(shellQuote).join(" ");
}

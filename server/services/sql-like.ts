/** `%` and `_` typed by a person are literal characters, not LIKE wildcards. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
}

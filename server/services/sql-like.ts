/** `%text%` for ILIKE, with `\`, `%` and `_` escaped (PostgreSQL's default LIKE escape is `\`), so a search matches its text literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

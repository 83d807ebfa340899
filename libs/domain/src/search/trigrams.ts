/**
 * The distinct three-character pieces of a string, in order of first appearance: what a trigram
 * index is searched with. Empty for strings shorter than three characters.
 */
export function trigramsOf(text: string): string[] {
  const seen = new Set<string>();
  for (let i = 0; i + 3 <= text.length; i++) seen.add(text.slice(i, i + 3));
  return [...seen];
}

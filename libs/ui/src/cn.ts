/** Joins class names, dropping the falsy ones (`cn('a', on && 'b')`). */
export function cn(...parts: Array<string | false | null | undefined>): string {
  return parts.filter(Boolean).join(' ');
}

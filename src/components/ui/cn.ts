/** Joins class names, dropping falsy entries, so variants can be written as `cond && 'class'`. */
export function cn(...classes: Array<string | false | null | undefined>): string {
  return classes.filter(Boolean).join(' ');
}

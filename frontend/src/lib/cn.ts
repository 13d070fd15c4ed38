type ClassValue = string | false | null | undefined | 0;

/** Joins the truthy class names into one `className` string (falsy entries are skipped). */
export function cn(...classes: ClassValue[]): string {
  return classes.filter(Boolean).join(' ');
}

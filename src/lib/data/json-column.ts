import 'server-only';

/**
 * A JSON column's value. MariaDB's JSON type is LONGTEXT with a validity check, so mysql2 hands it
 * over as a string; MySQL hands over the parsed value. Both are accepted.
 */
export function fromJsonColumn<T>(value: unknown): T {
  return (typeof value === 'string' ? JSON.parse(value) : value) as T;
}

/** The value for a JSON column (null stays SQL NULL). */
export function toJsonColumn(value: unknown): string | null {
  return value === null || value === undefined ? null : JSON.stringify(value);
}

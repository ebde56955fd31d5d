/**
 * True when PostgreSQL refused a statement for a foreign key (SQLSTATE 23503), e.g. deleting a row another table
 * still refers to. Drizzle may wrap the driver's error, so the cause chain is searched.
 */
export function isForeignKeyViolation(error: unknown): boolean {
  let current: unknown = error
  for (let depth = 0; depth < 5 && typeof current === 'object' && current !== null; depth++) {
    if ((current as { code?: unknown }).code === '23503') return true
    current = (current as { cause?: unknown }).cause
  }
  return false
}

/** True for MariaDB's duplicate-key error, which Drizzle wraps in `cause`. */
export function isDuplicateKey(error: unknown): boolean {
  const cause = (error as { cause?: { code?: string } })?.cause ?? error
  return (cause as { code?: string })?.code === 'ER_DUP_ENTRY'
}

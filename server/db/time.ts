/** Timestamps are stored as ISO-8601 UTC text: portable across SQLite and PostgreSQL and sortable. */
export function nowIso(): string {
  return new Date().toISOString();
}

export function isoInHours(hours: number): string {
  return new Date(Date.now() + hours * 3_600_000).toISOString();
}

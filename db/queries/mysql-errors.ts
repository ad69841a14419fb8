/** mysql2 mislabels some MariaDB errors, so match on errno (1062 = ER_DUP_ENTRY, 1452 = ER_NO_REFERENCED_ROW_2). */
function errnoOf(err: unknown): number | undefined {
  let e: unknown = err;
  for (let i = 0; i < 3 && e; i++) {
    const n = (e as { errno?: number }).errno;
    if (typeof n === "number") return n;
    e = (e as { cause?: unknown }).cause;
  }
  return undefined;
}

export const isDuplicateKey = (err: unknown) => errnoOf(err) === 1062;
export const isMissingReference = (err: unknown) => errnoOf(err) === 1452;

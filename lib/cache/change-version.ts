/**
 * A process-wide counter bumped by every recorded change (each change writes an audit event, see
 * db/queries/audit.ts). Read-mostly summaries such as the fleet status are cached against it, so they are recomputed
 * after any change and otherwise served from memory for a few seconds.
 */
const globalForVersion = globalThis as unknown as { halfmaxChangeVersion?: number };

export function bumpChangeVersion(): void {
  globalForVersion.halfmaxChangeVersion = (globalForVersion.halfmaxChangeVersion ?? 0) + 1;
}

export function changeVersion(): number {
  return globalForVersion.halfmaxChangeVersion ?? 0;
}

/**
 * Memoise an async computation per key for at most `ttlMs`, and never across a change: an entry made before the
 * latest bump is recomputed. ttlMs ≤ 0 disables the cache. The TTL also bounds staleness when several server
 * processes share one database (another process's changes do not bump this one's counter).
 */
export function versionedCache<T>(ttlMs: number) {
  const entries = new Map<string, { version: number; at: number; value: Promise<T> }>();
  return (key: string, compute: () => Promise<T>): Promise<T> => {
    if (ttlMs <= 0) return compute();
    const now = Date.now();
    const hit = entries.get(key);
    if (hit && hit.version === changeVersion() && now - hit.at < ttlMs) return hit.value;
    const version = changeVersion();
    const value = compute();
    entries.set(key, { version, at: now, value });
    value.catch(() => entries.delete(key));
    if (entries.size > 200) entries.delete(entries.keys().next().value as string);
    return value;
  };
}

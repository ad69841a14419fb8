import { describe, expect, it, vi } from "vitest";
import { bumpChangeVersion, versionedCache } from "@/lib/cache/change-version";

// The cache contract (common practice for read-mostly summaries): serve a memoised value until it expires or any
// change is recorded, whichever comes first.
describe("versionedCache(ttlMs)", () => {
  it("memoises per key within the TTL", async () => {
    const cache = versionedCache<number>(60_000);
    const compute = vi.fn(async () => 42);
    expect(await cache("a", compute)).toBe(42);
    expect(await cache("a", compute)).toBe(42);
    expect(compute).toHaveBeenCalledTimes(1);
    await cache("b", compute);
    expect(compute).toHaveBeenCalledTimes(2);
  });

  it("recomputes after a change is recorded", async () => {
    const cache = versionedCache<number>(60_000);
    let n = 0;
    const compute = async () => ++n;
    expect(await cache("k", compute)).toBe(1);
    bumpChangeVersion();
    expect(await cache("k", compute)).toBe(2);
    expect(await cache("k", compute)).toBe(2);
  });

  it("recomputes once the TTL has passed", async () => {
    vi.useFakeTimers();
    try {
      const cache = versionedCache<number>(1_000);
      let n = 0;
      const compute = async () => ++n;
      expect(await cache("k", compute)).toBe(1);
      vi.advanceTimersByTime(1_001);
      expect(await cache("k", compute)).toBe(2);
    } finally {
      vi.useRealTimers();
    }
  });

  it("does not keep a failed computation, and ttl 0 disables caching", async () => {
    const cache = versionedCache<number>(60_000);
    await expect(cache("k", async () => Promise.reject(new Error("db down")))).rejects.toThrow("db down");
    expect(await cache("k", async () => 7)).toBe(7);
    const off = versionedCache<number>(0);
    const compute = vi.fn(async () => 1);
    await off("k", compute);
    await off("k", compute);
    expect(compute).toHaveBeenCalledTimes(2);
  });
});

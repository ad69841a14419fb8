import { createHash, randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { projectRoot } from "@/lib/jobs/project-root";

/**
 * Where original uploads live. Keys are content addresses (sha256 hex), so the same bytes are stored once.
 * The filesystem driver is the default; an S3-compatible driver would implement the same four methods.
 */
export interface FileStorage {
  /** Store bytes under their SHA-256; returns the key and whether the object was new. */
  put(bytes: Uint8Array): Promise<{ key: string; created: boolean }>;
  get(key: string): Promise<Uint8Array>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Filesystem driver: STORAGE_DIR/ab/abcdef… with atomic writes (temp file + rename). */
export class FsStorage implements FileStorage {
  constructor(private readonly root: string) {}

  private pathOf(key: string): string {
    if (!/^[0-9a-f]{64}$/.test(key)) throw new Error(`invalid storage key ${key}`);
    return path.join(this.root, key.slice(0, 2), key);
  }

  async put(bytes: Uint8Array): Promise<{ key: string; created: boolean }> {
    const key = sha256Hex(bytes);
    const target = this.pathOf(key);
    if (await this.exists(key)) return { key, created: false };
    await mkdir(path.dirname(target), { recursive: true });
    const tmp = `${target}.${randomBytes(6).toString("hex")}.tmp`;
    await writeFile(tmp, bytes);
    await rename(tmp, target);
    return { key, created: true };
  }

  async get(key: string): Promise<Uint8Array> {
    return new Uint8Array(await readFile(this.pathOf(key)));
  }

  async exists(key: string): Promise<boolean> {
    try {
      await stat(this.pathOf(key));
      return true;
    } catch {
      return false;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }
}

let instance: FileStorage | null = null;

/** The configured storage (STORAGE_DIR; filesystem driver). */
export function storage(): FileStorage {
  if (!instance) {
    const root = process.env.STORAGE_DIR ?? path.join(projectRoot(), ".data", "dev", "storage");
    instance = new FsStorage(path.resolve(root));
  }
  return instance;
}

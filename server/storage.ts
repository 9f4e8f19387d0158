import { copyFile, mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';

/**
 * Where uploads (photos, captures, drawing images) live. One machine: a folder under
 * DATA_DIR. Past one machine: an object-storage implementation of the same interface.
 * Keys are opaque strings made by the caller (letters, digits, `-`, `_`, `/`, `.`).
 */
export interface Storage {
  put(key: string, data: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<{ data: Buffer; contentType: string } | null>;
  delete(key: string): Promise<void>;
  /** Optional: keep a file already on local disk (moved when it can be, else copied) without reading it into memory. */
  putFile?(key: string, sourcePath: string, contentType: string): Promise<void>;
}

function safeKey(key: string): string {
  if (!/^[A-Za-z0-9_\-./]+$/.test(key) || key.split('/').some((part) => part === '..' || part === '' || part === '.')) {
    throw new Error(`Storage key "${key}" is not allowed.`);
  }
  return key;
}

/** Files on local disk: `<dir>/<key>` plus `<dir>/<key>.type` holding the content type. */
export function diskStorage(dir: string): Storage {
  const file = (key: string) => path.join(dir, safeKey(key));
  return {
    async put(key, data, contentType) {
      const target = file(key);
      await mkdir(path.dirname(target), { recursive: true });
      await writeFile(target, data);
      await writeFile(`${target}.type`, contentType);
    },
    async get(key) {
      const target = file(key);
      try {
        const [data, contentType] = await Promise.all([readFile(target), readFile(`${target}.type`, 'utf8')]);
        return { data, contentType };
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw err;
      }
    },
    async putFile(key, sourcePath, contentType) {
      const target = file(key);
      await mkdir(path.dirname(target), { recursive: true });
      try {
        await rename(sourcePath, target);
      } catch {
        await copyFile(sourcePath, target);
        await rm(sourcePath, { force: true });
      }
      await writeFile(`${target}.type`, contentType);
    },
    async delete(key) {
      const target = file(key);
      await rm(target, { force: true });
      await rm(`${target}.type`, { force: true });
    },
  };
}

import { mkdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { randomUUID } from 'node:crypto';

/** Where uploaded files live. The local folder version is all we need now; an object store can implement the same. */
export interface FileStore {
  put(bytes: Buffer, extension: string): Promise<string>;
  get(key: string): Promise<Buffer | null>;
  remove(key: string): Promise<void>;
}

const KEY_RE = /^[0-9a-f]{2}\/[0-9a-f-]{36}\.[a-z0-9]{1,5}$/;

export function createLocalFileStore(root: string): FileStore {
  const resolve = (key: string) => {
    if (!KEY_RE.test(key)) throw new Error(`bad storage key ${key}`);
    return path.join(root, key);
  };
  return {
    async put(bytes, extension) {
      const id = randomUUID();
      const key = `${id.slice(0, 2)}/${id}.${extension}`;
      const file = resolve(key);
      await mkdir(path.dirname(file), { recursive: true });
      await writeFile(file, bytes, { flag: 'wx' });
      return key;
    },
    async get(key) {
      const file = resolve(key);
      if (!(await stat(file).catch(() => null))) return null;
      return readFile(file);
    },
    async remove(key) {
      await rm(resolve(key), { force: true });
    },
  };
}

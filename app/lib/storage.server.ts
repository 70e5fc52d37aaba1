// Certificate files go through this interface; the local-disk store keeps them under .data/certificates/.
import { randomUUID } from "node:crypto";
import { mkdir, readFile, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { CERTIFICATE_TYPES, type CertificateMediaType } from "./storage";

export interface FileStorage {
  /** Stores the bytes under a new key and returns the key; an existing file is never overwritten. */
  put(bytes: Uint8Array, mediaType: CertificateMediaType): Promise<string>;
  get(key: string): Promise<Uint8Array | null>;
}

const KEY = /^[0-9a-f-]{36}\.(pdf|png|jpg)$/;

export class LocalDiskStorage implements FileStorage {
  constructor(private readonly root: string) {}

  async put(bytes: Uint8Array, mediaType: CertificateMediaType): Promise<string> {
    const key = `${randomUUID()}.${CERTIFICATE_TYPES[mediaType].extension}`;
    await mkdir(this.root, { recursive: true });
    // Written aside and renamed, so a half-written file is never served.
    const temporary = path.join(this.root, `.${key}.part`);
    await writeFile(temporary, bytes, { flag: "wx" });
    await rename(temporary, path.join(this.root, key));
    return key;
  }

  async get(key: string): Promise<Uint8Array | null> {
    if (!KEY.test(key)) return null;
    return readFile(path.join(this.root, key)).catch(() => null);
  }
}

let storage: FileStorage | undefined;

export function certificateStorage(): FileStorage {
  storage ??= new LocalDiskStorage(process.env.CERTIFICATE_DIR ?? path.resolve(process.cwd(), ".data/certificates"));
  return storage;
}

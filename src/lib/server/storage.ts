import { mkdir, readFile, rm, writeFile, rename } from 'node:fs/promises';
import path from 'node:path';
import { config } from './config';
import { s3Storage } from './storage-s3';

/** A stored file's bytes and media type. */
export interface StoredFile {
	bytes: Buffer;
	type: string;
}

/**
 * Where the app keeps files (logos now; photos later). Keys are relative paths that begin with
 * the store's id (`<storeId>/logo-<hash>.png`), so a store's files stay together; the callers
 * check who may read a key, never the driver.
 */
export interface Storage {
	put(key: string, bytes: Buffer, type: string): Promise<void>;
	/** The file, or undefined when there is none. */
	get(key: string): Promise<StoredFile | undefined>;
	/** Removes the file; a missing file is not an error. */
	delete(key: string): Promise<void>;
}

const TYPES: Record<string, string> = {
	'.png': 'image/png',
	'.jpg': 'image/jpeg',
	'.jpeg': 'image/jpeg',
	'.webp': 'image/webp',
	'.pdf': 'application/pdf'
};

/** A key is safe when it is a plain relative path: no `..`, no absolute part, a known extension. */
export function checkKey(key: string): string {
	const parts = key.split('/');
	if (
		!/^[A-Za-z0-9_-][A-Za-z0-9/_.-]{0,200}$/.test(key) ||
		parts.some((p) => p === '' || p === '.' || p === '..') ||
		!(path.extname(key).toLowerCase() in TYPES)
	) {
		throw new Error(`Not a storage key: ${key}`);
	}
	return key;
}

/** The media type a key's extension stands for (keys are checked first). */
export function typeOfKey(key: string): string {
	return TYPES[path.extname(checkKey(key)).toLowerCase()];
}

/** The local-disk driver: files under `root`, the media type read from the key's extension. */
export function localDisk(root: string): Storage {
	const file = (key: string) => path.join(root, checkKey(key));
	return {
		async put(key, bytes, type) {
			const target = file(key);
			if (TYPES[path.extname(key).toLowerCase()] !== type) {
				throw new Error(`The key ${key} does not match the type ${type}`);
			}
			await mkdir(path.dirname(target), { recursive: true });
			// Written aside and renamed, so a reader never sees half a file.
			const temp = `${target}.${process.pid}.${Date.now()}.part`;
			await writeFile(temp, bytes);
			await rename(temp, target);
		},
		async get(key) {
			try {
				const bytes = await readFile(file(key));
				return { bytes, type: TYPES[path.extname(key).toLowerCase()] };
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
				throw e;
			}
		},
		async delete(key) {
			await rm(file(key), { force: true });
		}
	};
}

let current: Storage | undefined;

/**
 * The app's storage, chosen by configuration: local disk under the data folder
 * (`<dataDir>/files`, the default) or an S3-compatible bucket (`FLUSHLINE_STORAGE=s3`).
 */
export function storage(): Storage {
	if (!current) {
		const s3 = config.s3;
		current = s3 ? s3Storage(s3) : localDisk(path.join(config.dataDir, 'files'));
	}
	return current;
}

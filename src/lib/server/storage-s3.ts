import {
	DeleteObjectCommand,
	GetObjectCommand,
	NoSuchKey,
	PutObjectCommand,
	S3Client,
	S3ServiceException
} from '@aws-sdk/client-s3';
import { checkKey, typeOfKey, type Storage } from './storage';

/** Where an S3-compatible bucket is and how to reach it (README, "Deploying on several servers"). */
export interface S3Settings {
	bucket: string;
	region: string;
	/** A non-AWS endpoint (MinIO, a provider's, a local test server); empty for AWS itself. */
	endpoint?: string;
	/** Addresses as `<endpoint>/<bucket>/<key>` rather than `<bucket>.<endpoint>/<key>`. */
	forcePathStyle?: boolean;
	accessKeyId?: string;
	secretAccessKey?: string;
	/** Keys go under this prefix in the bucket (`flushline/`), so one bucket can hold more. */
	prefix?: string;
}

/**
 * The S3-compatible driver: the same keys as the local disk, as objects in a private bucket.
 * Nothing is made public: the app reads a file and serves it through its own access checks
 * (photo and logo routes), so the bucket needs no public policy and no signed URLs leave the
 * server. A put is one PutObject, which S3 makes visible whole or not at all.
 */
export function s3Storage(settings: S3Settings, client?: S3Client): Storage {
	const s3 =
		client ??
		new S3Client({
			region: settings.region,
			endpoint: settings.endpoint || undefined,
			forcePathStyle: settings.forcePathStyle ?? Boolean(settings.endpoint),
			credentials:
				settings.accessKeyId && settings.secretAccessKey
					? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey }
					: undefined,
			// A failed read or write surfaces at once; the caller decides (the phone resends).
			maxAttempts: 2
		});
	const prefix = settings.prefix ?? '';
	const objectKey = (key: string) => `${prefix}${checkKey(key)}`;
	return {
		async put(key, bytes, type) {
			if (typeOfKey(key) !== type) {
				throw new Error(`The key ${key} does not match the type ${type}`);
			}
			await s3.send(
				new PutObjectCommand({
					Bucket: settings.bucket,
					Key: objectKey(key),
					Body: bytes,
					ContentType: type
				})
			);
		},
		async get(key) {
			try {
				const answer = await s3.send(
					new GetObjectCommand({ Bucket: settings.bucket, Key: objectKey(key) })
				);
				if (!answer.Body) return undefined;
				const bytes = Buffer.from(await answer.Body.transformToByteArray());
				return { bytes, type: typeOfKey(key) };
			} catch (e) {
				if (e instanceof NoSuchKey) return undefined;
				if (e instanceof S3ServiceException && e.$metadata.httpStatusCode === 404) return undefined;
				throw e;
			}
		},
		async delete(key) {
			// S3 answers a delete of a missing key with success, as the local driver does.
			await s3.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: objectKey(key) }));
		}
	};
}

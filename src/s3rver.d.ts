// The parts of s3rver (a local S3-compatible server, used only by tests) that the tests use; the
// package ships no types.
declare module 's3rver' {
	interface S3rverOptions {
		port?: number;
		address?: string;
		silent?: boolean;
		directory: string;
	}
	export default class S3rver {
		constructor(options: S3rverOptions);
		run(): Promise<{ address: string; port: number }>;
		close(): Promise<void>;
	}
}

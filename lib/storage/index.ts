import "server-only";
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import { Readable } from "node:stream";
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  ListObjectsV2Command,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";

/**
 * The one way files (datasheets, data logs, certificates) are kept: an S3-compatible store. Locally
 * that is the s3rver fake the scripts start on loopback; in production any S3 API.
 */
export interface StoredObject {
  key: string;
  sha256: string;
  sizeBytes: number;
}

function config() {
  const endpoint = process.env.S3_ENDPOINT;
  if (!endpoint) throw new Error("S3_ENDPOINT is not set (the scripts in scripts/ set it)");
  return {
    endpoint,
    bucket: process.env.S3_BUCKET ?? "cellwright",
    region: process.env.S3_REGION ?? "us-east-1",
    accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "S3RVER",
    secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "S3RVER",
  };
}

const globalForS3 = globalThis as unknown as { cellwrightS3?: { client: S3Client; bucket: string; ready?: Promise<void> } };

function getStore() {
  if (!globalForS3.cellwrightS3) {
    const c = config();
    const client = new S3Client({
      endpoint: c.endpoint,
      region: c.region,
      forcePathStyle: true,
      // Send bodies as they are: by default the client frames uploads as aws-chunked with a trailing
      // CRC32, which a store that does not decode it (older s3rver, some gateways) keeps as content.
      // Our integrity check is the SHA-256 recorded at upload and checked on every read (verified-read.ts).
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
      credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
    });
    globalForS3.cellwrightS3 = { client, bucket: c.bucket };
  }
  const store = globalForS3.cellwrightS3;
  store.ready ??= ensureBucket(store.client, store.bucket).catch((e: unknown) => {
    store.ready = undefined;
    throw e;
  });
  return store;
}

async function ensureBucket(client: S3Client, bucket: string): Promise<void> {
  try {
    await client.send(new HeadBucketCommand({ Bucket: bucket }));
  } catch {
    await client.send(new CreateBucketCommand({ Bucket: bucket }));
  }
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

export async function putObject(key: string, bytes: Uint8Array, contentType: string): Promise<StoredObject> {
  const store = getStore();
  await store.ready;
  const sha256 = sha256Hex(bytes);
  await store.client.send(
    new PutObjectCommand({ Bucket: store.bucket, Key: key, Body: bytes, ContentType: contentType, Metadata: { sha256 } }),
  );
  return { key, sha256, sizeBytes: bytes.byteLength };
}

/** Raw bytes for tests and tools. Never hand these out: readVerifiedFile (lib/integrity) checks them first. */
export async function getObjectBytes(key: string): Promise<Uint8Array> {
  const store = getStore();
  await store.ready;
  const res = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: key }));
  if (!res.Body) throw new Error(`stored file ${key} has no body`);
  return res.Body.transformToByteArray();
}

/** The stored bytes, or null when the store has no object under the key. Callers check the recorded hash. */
export async function readObjectOrNull(key: string): Promise<Uint8Array | null> {
  const store = getStore();
  await store.ready;
  try {
    const res = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: key }));
    if (!res.Body) return null;
    return await res.Body.transformToByteArray();
  } catch (error) {
    if (error instanceof NoSuchKey || (error as { name?: string }).name === "NotFound") return null;
    throw error;
  }
}

export async function deleteObject(key: string): Promise<void> {
  const store = getStore();
  await store.ready;
  await store.client.send(new DeleteObjectCommand({ Bucket: store.bucket, Key: key }));
}

/** Keys under a prefix (e.g. everything stored for one record); used by checks and clean-up. */
export async function listObjectKeys(prefix: string): Promise<string[]> {
  const store = getStore();
  await store.ready;
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const res = await store.client.send(new ListObjectsV2Command({ Bucket: store.bucket, Prefix: prefix, ContinuationToken: token }));
    keys.push(...(res.Contents ?? []).map((o) => o.Key ?? "").filter(Boolean));
    token = res.IsTruncated ? res.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

/** Stores a file already on local disk (a streamed upload), whose hash and size the caller measured. */
export async function putObjectFromFile(key: string, file: { path: string; sizeBytes: number; sha256: string }, contentType: string): Promise<StoredObject> {
  const store = getStore();
  await store.ready;
  await store.client.send(
    new PutObjectCommand({
      Bucket: store.bucket,
      Key: key,
      Body: createReadStream(file.path),
      ContentLength: file.sizeBytes,
      ContentType: contentType,
      Metadata: { sha256: file.sha256 },
    }),
  );
  return { key, sha256: file.sha256, sizeBytes: file.sizeBytes };
}

/**
 * Streams bytes of a known length into the store, hashing them on the way: nothing is held on local
 * disk or in memory beyond one chunk. The hash is the caller's to record; every later read is checked
 * against it (lib/integrity). A body shorter or longer than `sizeBytes` fails the upload.
 */
export async function putObjectFromChunks(key: string, chunks: AsyncIterable<Uint8Array>, sizeBytes: number, contentType: string): Promise<StoredObject> {
  const store = getStore();
  await store.ready;
  const hash = createHash("sha256");
  let counted = 0;
  async function* hashed(): AsyncIterable<Uint8Array> {
    for await (const chunk of chunks) {
      hash.update(chunk);
      counted += chunk.byteLength;
      yield chunk;
    }
  }
  await store.client.send(
    new PutObjectCommand({ Bucket: store.bucket, Key: key, Body: Readable.from(hashed()), ContentLength: sizeBytes, ContentType: contentType }),
  );
  if (counted !== sizeBytes) throw new Error(`the upload sent ${counted} bytes but declared ${sizeBytes}`);
  return { key, sha256: hash.digest("hex"), sizeBytes };
}

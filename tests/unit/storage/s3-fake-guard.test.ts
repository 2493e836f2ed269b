import { GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { describe, expect, it } from "vitest";
import { decodeAwsChunked, verifySignature } from "../../../scripts/s3-fake-guard.mjs";

// The stand-in's signature check against requests signed by the S3 client itself: a request handler
// that keeps the signed request instead of sending it.
const keys = { accessKeyId: "CWKEY", secretAccessKey: "cw-secret" };

interface Captured {
  method: string;
  path: string;
  query?: Record<string, string | string[] | null>;
  headers: Record<string, string>;
}

async function signed(command: GetObjectCommand | ListObjectsV2Command | PutObjectCommand, secretAccessKey = keys.secretAccessKey) {
  let captured: Captured | undefined;
  const client = new S3Client({
    endpoint: "http://127.0.0.1:54341",
    region: "us-east-1",
    forcePathStyle: true,
    requestChecksumCalculation: "WHEN_REQUIRED",
    credentials: { accessKeyId: keys.accessKeyId, secretAccessKey },
    maxAttempts: 1,
    requestHandler: {
      handle: async (request: Captured) => {
        captured = request;
        throw new Error("captured");
      },
    },
  });
  await client.send(command as GetObjectCommand).catch(() => {});
  const c = captured!;
  const qs = new URLSearchParams(Object.entries(c.query ?? {}).map(([k, v]) => [k, String(v ?? "")])).toString();
  return { method: c.method, url: qs ? `${c.path}?${qs}` : c.path, headers: Object.fromEntries(Object.entries(c.headers).map(([k, v]) => [k.toLowerCase(), v])) };
}

describe("the S3 stand-in's guard", () => {
  it("accepts requests the S3 client signs with the store's key, a key with spaces and a query included", async () => {
    const get = await signed(new GetObjectCommand({ Bucket: "cellwright", Key: "logs/a b+c.csv" }));
    expect(() => verifySignature(get, keys)).not.toThrow();
    const list = await signed(new ListObjectsV2Command({ Bucket: "cellwright", Prefix: "logs/", ContinuationToken: "a=b/c" }));
    expect(list.url).toContain("?");
    expect(() => verifySignature(list, keys)).not.toThrow();
    const put = await signed(new PutObjectCommand({ Bucket: "cellwright", Key: "datasheets/x.pdf", Body: Buffer.from("%PDF-1.7"), ContentType: "application/pdf", Metadata: { sha256: "ab" } }));
    expect(() => verifySignature(put, keys)).not.toThrow();
  });

  it("refuses anonymous, wrongly keyed, altered and stale requests", async () => {
    expect(() => verifySignature({ method: "GET", url: "/cellwright/x", headers: { host: "127.0.0.1:54341" } }, keys)).toThrow(/Anonymous access is not allowed/);
    expect(() => verifySignature(signedWith("other"), keys)).toThrow(/does not exist/);
    const wrongSecret = await signed(new GetObjectCommand({ Bucket: "cellwright", Key: "k" }), "another");
    expect(() => verifySignature(wrongSecret, keys)).toThrow(/signature we calculated does not match/);
    const altered = await signed(new GetObjectCommand({ Bucket: "cellwright", Key: "logs/a.csv" }));
    altered.url = altered.url.replace("a.csv", "b.csv");
    expect(() => verifySignature(altered, keys)).toThrow(/does not match/);
    const stale = await signed(new GetObjectCommand({ Bucket: "cellwright", Key: "k" }));
    stale.headers["x-amz-date"] = "20200101T000000Z";
    expect(() => verifySignature(stale, keys)).toThrow(/date/);
  });

  it("decodes aws-chunked framing, chunk signatures and trailers included", () => {
    const body = Buffer.from("3;chunk-signature=ab\r\nabc\r\n2\r\nde\r\n0\r\nx-amz-checksum-crc32:NSRBwg==\r\n\r\n");
    expect(decodeAwsChunked(body)).toEqual({ content: Buffer.from("abcde"), trailers: { "x-amz-checksum-crc32": "NSRBwg==" } });
    expect(() => decodeAwsChunked(Buffer.from("10\r\nabc"))).toThrow(/shorter than its chunk headers/);
  });
});

/** A request whose credential names another access key id. */
function signedWith(accessKeyId: string) {
  return {
    method: "GET",
    url: "/cellwright/k",
    headers: { host: "127.0.0.1:54341", "x-amz-date": "20261204T000000Z", authorization: `AWS4-HMAC-SHA256 Credential=${accessKeyId}/20261204/us-east-1/s3/aws4_request, SignedHeaders=host;x-amz-date, Signature=${"0".repeat(64)}` },
  };
}

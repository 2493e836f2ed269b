// What the local S3 stand-in adds in front of s3rver so it behaves like the real service for what
// Cellwright uses: every request must carry a valid AWS Signature Version 4 (s3rver lets anonymous
// requests through and never checks V4 signatures), and an object upload is stored as the bytes the
// client meant: `aws-chunked` framing is decoded and its trailing checksum, a hex x-amz-content-sha256
// and a Content-MD5 are checked before anything is written (s3rver would store the framing as content).
// Reference: AWS S3 API, "Authenticating Requests (AWS Signature Version 4)" and "Checking object
// integrity" (recalled from the public documentation; the client in @aws-sdk/client-s3 is the check).
import { createHash, createHmac, timingSafeEqual } from "node:crypto";
import { crc32 } from "node:zlib";
import S3Error from "s3rver/lib/models/error.js";

const MAX_SKEW_MS = 15 * 60 * 1000;

function refuse(code, message, status) {
  const error = new S3Error(code, message);
  error.status = status;
  return error;
}

// RFC 3986 unreserved characters stay; everything else is percent-encoded, as SigV4 requires.
const encodeRfc3986 = (s) => encodeURIComponent(s).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
const decodeQueryPart = (s) => decodeURIComponent(s.replace(/\+/g, "%20"));

function canonicalQuery(rawQuery, skip) {
  if (!rawQuery) return "";
  return rawQuery
    .split("&")
    .filter(Boolean)
    .map((pair) => {
      const i = pair.indexOf("=");
      const k = decodeQueryPart(i < 0 ? pair : pair.slice(0, i));
      const v = i < 0 ? "" : decodeQueryPart(pair.slice(i + 1));
      return [encodeRfc3986(k), encodeRfc3986(v)];
    })
    .filter(([k]) => k !== skip)
    .sort(([a, av], [b, bv]) => (a < b ? -1 : a > b ? 1 : av < bv ? -1 : av > bv ? 1 : 0))
    .map(([k, v]) => `${k}=${v}`)
    .join("&");
}

const hmac = (key, data) => createHmac("sha256", key).update(data).digest();
const sha256Hex = (data) => createHash("sha256").update(data).digest("hex");

/** Parses the Authorization header or the presigned query of a request; null when it carries neither. */
function readSignature(req, query) {
  const auth = req.headers.authorization;
  if (auth) {
    const m = /^AWS4-HMAC-SHA256 Credential=([^,]+),\s*SignedHeaders=([^,]+),\s*Signature=([0-9a-f]{64})$/.exec(auth.trim());
    if (!m) throw refuse("AccessDenied", "Only AWS Signature Version 4 is accepted.", 403);
    return { credential: m[1], signedHeaders: m[2], signature: m[3], date: req.headers["x-amz-date"], payloadHash: req.headers["x-amz-content-sha256"] ?? "UNSIGNED-PAYLOAD", presigned: false };
  }
  if (query.get("X-Amz-Algorithm")) {
    if (query.get("X-Amz-Algorithm") !== "AWS4-HMAC-SHA256") throw refuse("AccessDenied", "Only AWS Signature Version 4 is accepted.", 403);
    const expires = Number(query.get("X-Amz-Expires") ?? "0");
    return { credential: query.get("X-Amz-Credential") ?? "", signedHeaders: query.get("X-Amz-SignedHeaders") ?? "", signature: query.get("X-Amz-Signature") ?? "", date: query.get("X-Amz-Date"), payloadHash: "UNSIGNED-PAYLOAD", presigned: true, expires };
  }
  return null;
}

function parseAmzDate(s) {
  const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(s ?? "");
  return m ? Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) : NaN;
}

/** Refuses a request unless it is signed (SigV4) with the one key pair the stand-in knows. */
export function verifySignature(req, keys) {
  const [rawPath, rawQuery = ""] = (req.url ?? "/").split("?", 2);
  const query = new URLSearchParams(rawQuery);
  const sig = readSignature(req, query);
  if (!sig) throw refuse("AccessDenied", "Anonymous access is not allowed: sign the request with the store's access key.", 403);
  const [accessKeyId, day, region, service, terminator] = sig.credential.split("/");
  if (accessKeyId !== keys.accessKeyId) throw refuse("InvalidAccessKeyId", "The access key id you provided does not exist in our records.", 403);
  if (!day || !region || service !== "s3" || terminator !== "aws4_request") throw refuse("AuthorizationHeaderMalformed", "The credential scope is malformed.", 400);
  const at = parseAmzDate(sig.date);
  if (Number.isNaN(at) || !sig.date.startsWith(day)) throw refuse("AccessDenied", "The request date is missing or does not match the credential scope.", 403);
  if (sig.presigned ? Date.now() > at + sig.expires * 1000 : Math.abs(Date.now() - at) > MAX_SKEW_MS) {
    throw refuse(sig.presigned ? "AccessDenied" : "RequestTimeTooSkewed", sig.presigned ? "Request has expired." : "The difference between the request time and the current time is too large.", 403);
  }
  const names = sig.signedHeaders.split(";");
  if (!names.includes("host")) throw refuse("AccessDenied", "The host header must be signed.", 403);
  const canonicalHeaders = names.map((n) => `${n}:${String(req.headers[n] ?? "").trim().replace(/\s+/g, " ")}\n`).join("");
  const canonicalRequest = [req.method, rawPath, canonicalQuery(rawQuery, sig.presigned ? "X-Amz-Signature" : null), canonicalHeaders, sig.signedHeaders, sig.payloadHash].join("\n");
  const scope = `${day}/${region}/s3/aws4_request`;
  const stringToSign = ["AWS4-HMAC-SHA256", sig.date, scope, sha256Hex(canonicalRequest)].join("\n");
  const key = hmac(hmac(hmac(hmac(`AWS4${keys.secretAccessKey}`, day), region), "s3"), "aws4_request");
  const expected = hmac(key, stringToSign);
  const given = Buffer.from(sig.signature, "hex");
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) {
    throw refuse("SignatureDoesNotMatch", "The request signature we calculated does not match the signature you provided.", 403);
  }
}

async function readBody(req) {
  const parts = [];
  for await (const part of req) parts.push(part);
  return Buffer.concat(parts);
}

/** Decodes aws-chunked framing (`<hex size>[;chunk-signature=…]\r\n<data>\r\n … 0\r\n<trailers>\r\n`). */
export function decodeAwsChunked(body) {
  const chunks = [];
  const trailers = {};
  let at = 0;
  for (;;) {
    const eol = body.indexOf("\r\n", at);
    if (eol < 0) throw refuse("IncompleteBody", "The aws-chunked body ends inside a chunk header.", 400);
    const size = parseInt(body.subarray(at, eol).toString("latin1").split(";")[0], 16);
    if (!Number.isFinite(size) || size < 0) throw refuse("InvalidRequest", "An aws-chunked chunk header is malformed.", 400);
    at = eol + 2;
    if (size === 0) break;
    if (at + size + 2 > body.length) throw refuse("IncompleteBody", "The aws-chunked body is shorter than its chunk headers say.", 400);
    chunks.push(body.subarray(at, at + size));
    at += size + 2;
  }
  for (const line of body.subarray(at).toString("latin1").split("\r\n")) {
    const i = line.indexOf(":");
    if (i > 0) trailers[line.slice(0, i).trim().toLowerCase()] = line.slice(i + 1).trim();
  }
  return { content: Buffer.concat(chunks), trailers };
}

const CHECKSUMS = {
  "x-amz-checksum-crc32": (b) => {
    const out = Buffer.alloc(4);
    out.writeUInt32BE(crc32(b) >>> 0);
    return out.toString("base64");
  },
  "x-amz-checksum-sha1": (b) => createHash("sha1").update(b).digest("base64"),
  "x-amz-checksum-sha256": (b) => createHash("sha256").update(b).digest("base64"),
};

function checkDigests(content, headers) {
  const declared = headers["x-amz-content-sha256"];
  if (declared && /^[0-9a-f]{64}$/.test(declared) && sha256Hex(content) !== declared) {
    throw refuse("XAmzContentSHA256Mismatch", "The provided 'x-amz-content-sha256' header does not match what was computed.", 400);
  }
  if (headers["content-md5"] && createHash("md5").update(content).digest("base64") !== headers["content-md5"]) {
    throw refuse("BadDigest", "The Content-MD5 you specified did not match what we received.", 400);
  }
  for (const [name, compute] of Object.entries(CHECKSUMS)) {
    if (headers[name] && compute(content) !== headers[name]) throw refuse("BadDigest", `The ${name.slice(6)} you specified did not match the calculated checksum.`, 400);
  }
}

/**
 * Koa middleware for s3rver: signature first, then for an object PUT the body is read whole, decoded
 * and checked, and s3rver is handed exactly the object's bytes (it stores a Buffer as given).
 */
export function s3Guard(keys) {
  return async function guard(ctx, next) {
    verifySignature(ctx.req, keys);
    const [rawPath, rawQuery = ""] = (ctx.req.url ?? "/").split("?", 2);
    const isObjectPut = ctx.method === "PUT" && rawPath.split("/").filter(Boolean).length >= 2 && !ctx.headers["x-amz-copy-source"] && !/(^|&)(uploadId|partNumber|tagging|acl)=?/.test(rawQuery);
    if (isObjectPut) {
      let content = await readBody(ctx.req);
      const headers = ctx.req.headers;
      const encodings = (headers["content-encoding"] ?? "").split(",").map((s) => s.trim()).filter(Boolean);
      const chunked = encodings.includes("aws-chunked") || String(headers["x-amz-content-sha256"] ?? "").startsWith("STREAMING-");
      if (chunked) {
        const decoded = decodeAwsChunked(content);
        content = decoded.content;
        Object.assign(headers, decoded.trailers);
        const declaredLength = headers["x-amz-decoded-content-length"];
        if (declaredLength !== undefined && Number(declaredLength) !== content.length) throw refuse("IncompleteBody", "The decoded body length differs from x-amz-decoded-content-length.", 400);
        const rest = encodings.filter((e) => e !== "aws-chunked");
        if (rest.length) headers["content-encoding"] = rest.join(","); else delete headers["content-encoding"];
        headers["x-amz-content-sha256"] = "UNSIGNED-PAYLOAD";
      }
      checkDigests(content, headers);
      headers["content-length"] = String(content.length);
      ctx.req = content;
    }
    return next();
  };
}

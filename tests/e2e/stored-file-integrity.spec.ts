import { GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { expect, test } from "@playwright/test";
import pg from "pg";
import { signInAs } from "./fixtures";

// The seeded certificate's stored PDF is changed behind the app's back for these tests, then put back.
const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: "us-east-1",
  forcePathStyle: true,
  requestChecksumCalculation: "WHEN_REQUIRED",
  responseChecksumValidation: "WHEN_REQUIRED",
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "", secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "" },
});
const Bucket = process.env.S3_BUCKET ?? "cellwright";
let number = "";
let key = "";
let original: Uint8Array;

test.describe.configure({ mode: "serial" });

test.beforeAll(async () => {
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    const r = await client.query<{ number: string; storage_key: string }>(
      "select c.number, f.storage_key from certificate c join stored_file f on f.id = c.pdf_file_id where c.run_id is not null order by c.issued_at limit 1",
    );
    ({ number, storage_key: key } = r.rows[0]!);
  } finally {
    await client.end();
  }
  original = await (await s3.send(new GetObjectCommand({ Bucket, Key: key }))).Body!.transformToByteArray();
  const changed = Buffer.from(original);
  changed[2000]! ^= 0x01;
  await s3.send(new PutObjectCommand({ Bucket, Key: key, Body: changed, ContentType: "application/pdf" }));
});

test.afterAll(async () => {
  if (original) await s3.send(new PutObjectCommand({ Bucket, Key: key, Body: original, ContentType: "application/pdf" }));
});

test("an auditor who asks for a certificate whose stored PDF was changed gets a plain refusal, not the file", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "auditor");
  await page.goto(`/certificates/${number}`);
  await page.getByRole("link", { name: "Download the PDF" }).click();
  await expect(page.getByRole("heading", { name: "This file is not handed out" })).toBeVisible();
  await expect(page.getByRole("alert")).toContainText(`The stored copy of the PDF of certificate ${number} does not match the SHA-256 recorded when it was stored`);
  await page.screenshot({ path: "test-results/integrity-refused-download.png", fullPage: true });
  // A script asking for it gets the same refusal as JSON, never the bytes.
  const api = await page.request.get(`/api/certificates/${number}/pdf`);
  expect(api.status()).toBe(409);
  expect((await api.json()).error.code).toBe("integrity");
});

test("an admin sees the refusal and the on-demand check names the changed file", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "admin");
  await page.goto("/admin/integrity");
  await expect(page.getByTestId("integrity-faults")).toContainText(`the PDF of certificate ${number}`);
  await expect(page.getByTestId("integrity-faults")).toContainText("content does not match the recorded SHA-256");
  await page.getByRole("button", { name: "Check everything now" }).click();
  const check = page.getByTestId("integrity-check");
  await expect(check).toContainText("Audit trail intact");
  await expect(check).toContainText(`The stored copy of the PDF of certificate ${number} does not match`);
  await page.screenshot({ path: "test-results/integrity-admin.png", fullPage: true });
});

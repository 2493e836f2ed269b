import { z } from "zod";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { readLimitedForm } from "@/lib/api/limited-body";
import { refuseForeignUpload } from "@/lib/auth/foreign-origin";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { attachDatasheet } from "@/lib/specs/cell-specifications";
import { DATASHEET_MAX_BYTES, datasheetTooLargeMessage } from "@/lib/specs/datasheet-limits";
import { readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { withFileRefusalPage } from "@/lib/integrity/file-refusal-page";

export const GET = apiRoute("/api/specs/[id]/datasheet", "GET", withFileRefusalPage(async (_req, { user, params }) => {
  const id = z.uuid("Not a specification id.").parse(params.id);
  const spec = await getCellSpecification(getDb(), id);
  if (!spec?.datasheet) throw new DomainError("not-found", "This specification has no datasheet.");
  const { file, bytes } = await readVerifiedFile(spec.datasheet.fileId, user, "datasheet download");
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${file.fileName.replace(/[^\w.\- ]/g, "_")}"`,
      "x-content-sha256": file.sha256,
      "x-content-type-options": "nosniff",
    },
  });
}));

/**
 * Multipart upload of a datasheet PDF (field "datasheet"). Counted as it arrives and refused past the
 * limit; parsed as a PDF before it is stored with its SHA-256. The proxy leaves this route out (it would
 * cut the body at its own buffer size), so the origin check is made here first.
 */
const upload = apiRoute("/api/specs/[id]/datasheet", "POST", async (req, { user, params }) => {
  const id = z.uuid("Not a specification id.").parse(params.id);
  const declared = Number(req.headers.get("content-length") ?? "0");
  const tooLarge = () => datasheetTooLargeMessage(declared > DATASHEET_MAX_BYTES ? declared : undefined);
  if (!(req.headers.get("content-type") ?? "").startsWith("multipart/form-data")) {
    throw new DomainError("invalid", "Send the datasheet as a multipart form with the field “datasheet”.");
  }
  // A form carries its field headers and boundaries around the file.
  const form = await readLimitedForm(req, DATASHEET_MAX_BYTES + 64 * 1024, tooLarge);
  const file = form.get("datasheet");
  if (!(file instanceof File)) throw new DomainError("invalid", "No file in the field “datasheet”.");
  const stored = await attachDatasheet(user, id, { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) });
  return Response.json(stored, { status: 201 });
});

export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }): Promise<Response> {
  return (await refuseForeignUpload(req)) ?? upload(req, ctx);
}

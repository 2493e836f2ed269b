import { z } from "zod";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { attachDatasheet } from "@/lib/specs/cell-specifications";
import { readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { withFileRefusalPage } from "@/lib/integrity/file-refusal-page";

export const GET = apiRoute<{ id: string }>("spec.read", withFileRefusalPage(async (_req, { user, params }) => {
  const id = z.uuid("Not a specification id.").parse(params.id);
  const spec = await getCellSpecification(getDb(), id);
  if (!spec?.datasheet) throw new DomainError("not-found", "This specification has no datasheet.");
  const { file, bytes } = await readVerifiedFile(spec.datasheet.fileId, user, "datasheet download");
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${file.fileName.replace(/[^\w.\- ]/g, "_")}"`,
      "x-content-sha256": file.sha256,
    },
  });
}));

/** Multipart upload of a datasheet PDF (field "datasheet"). Checked by content; stored with its SHA-256. */
export const POST = apiRoute<{ id: string }>("spec.manage", async (req, { user, params }) => {
  const id = z.uuid("Not a specification id.").parse(params.id);
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new DomainError("invalid", "Send the datasheet as a multipart form with the field “datasheet”.");
  }
  const file = form.get("datasheet");
  if (!(file instanceof File)) throw new DomainError("invalid", "No file in the field “datasheet”.");
  const stored = await attachDatasheet(user, id, { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) });
  return Response.json(stored, { status: 201 });
});

import "server-only";
import { notFound } from "next/navigation";
import { z } from "zod";
import { isDomainError } from "@/lib/errors";

/** A page's record: a malformed id or a missing record both answer with the segment's not-found page. */
export async function readOrNotFound<T>(rawId: string, read: (id: string) => Promise<T>): Promise<T> {
  const id = z.uuid().safeParse(rawId);
  if (!id.success) notFound();
  try {
    return await read(id.data);
  } catch (error) {
    if (isDomainError(error) && error.code === "not-found") notFound();
    throw error;
  }
}

/**
 * What the editor sends to the save action: which version, and the whole draft as an object (not
 * FormData). The action checks both with zod, so the draft stays `unknown` on the way in.
 */
export interface SaveDraftRequest {
  procedureId: string;
  number: number;
  draft: unknown;
}

export { ProcedureEditor } from "./procedure-editor";
export type { SaveDraftRequest } from "./save-draft-request";

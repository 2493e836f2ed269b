export { ProcedurePreview } from "./procedure-preview";
export type { PreviewSource } from "./use-resolution";

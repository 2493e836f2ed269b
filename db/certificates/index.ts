// Certificate queries, one file per concern; import from "@/db/certificates".
export * from "./read-certificates";
export * from "./certificate-record";
export * from "./issue-certificate";
export * from "./certificate-basis";

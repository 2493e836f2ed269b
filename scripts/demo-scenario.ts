import type { Role } from "../db/schema";

/**
 * The demo is set in an invented lab. Every name, address and e-mail here is made up; the e-mail
 * domain is reserved for examples (RFC 2606).
 */
export const DEMO_LAB = {
  name: "Brackwater Cell Test Laboratory",
  address: "7 Tannery Lane, Brackwater Industrial Park, Eastmoor EM4 2QT",
  accreditation: "Demo only: no accreditation",
};

export const DEMO_USERS: { email: string; displayName: string; role: Role; password: string }[] = [
  { email: "admin@brackwater.example", displayName: "Ines Varga", role: "admin", password: "demo-admin-pass" },
  { email: "engineer@brackwater.example", displayName: "Dana Okafor", role: "engineer", password: "demo-engineer-pass" },
  { email: "engineer2@brackwater.example", displayName: "Tomas Lindqvist", role: "engineer", password: "demo-engineer-pass" },
  { email: "operator@brackwater.example", displayName: "Priya Raman", role: "operator", password: "demo-operator-pass" },
  { email: "auditor@brackwater.example", displayName: "Felix Aubert", role: "auditor", password: "demo-auditor-pass" },
];

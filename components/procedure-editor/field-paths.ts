// Pure helpers that tie a form path ("definition.steps.2.current.value", the zod path the server
// reports too) to the control that edits it, to its error messages and to words a person reads.

export interface PathMessage {
  path: string;
  message: string;
}

/** The DOM id of the control that edits a path: "pf-definition-steps-2-current-value". */
export function fieldId(path: string): string {
  return `pf-${path.replace(/[^A-Za-z0-9_-]/g, "-")}`;
}

/** The id of the element that shows a path's errors (for aria-describedby). */
export function errorId(path: string): string {
  return `${fieldId(path)}-error`;
}

const ERROR_LEAF_KEYS = new Set(["message", "type", "types", "ref"]);

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null;
}

/**
 * Every message in a react-hook-form error tree, with its dot path. A field array's own error
 * ("root") belongs to the array's path. The `ref` of an error (a DOM node) is never walked.
 */
export function flattenFieldErrors(errors: unknown, prefix = ""): PathMessage[] {
  const found: PathMessage[] = [];
  const walk = (node: unknown, path: string) => {
    if (!isRecord(node)) return;
    if (typeof node.message === "string" && node.message !== "") found.push({ path, message: node.message });
    for (const [key, child] of Object.entries(node)) {
      if (ERROR_LEAF_KEYS.has(key)) continue;
      const childPath = key === "root" ? path : path ? `${path}.${key}` : key;
      walk(child, childPath);
    }
  };
  walk(errors, prefix);
  const seen = new Set<string>();
  return found.filter((item) => {
    const key = `${item.path}\u0000${item.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** Messages recorded at exactly this path (not below it), including a field array's own ones. */
export function selectOwnMessages(all: readonly PathMessage[], path: string): string[] {
  return all.filter((item) => item.path === path).map((item) => item.message);
}

/** The path itself, then each shorter path above it: where to move focus when a path has no control. */
export function listPathAncestors(path: string): string[] {
  const parts = path.split(".");
  return parts.map((_, index) => parts.slice(0, parts.length - index).join("."));
}

const FIELD_WORDS: Record<string, string> = {
  title: "title",
  code: "code",
  scope: "scope",
  standard: "standard",
  clause: "clause",
  ambient: "ambient",
  tolerances: "tolerances",
  notes: "notes",
  label: "label",
  id: "id",
  instructions: "operator instructions",
  current: "current",
  voltage: "voltage",
  endVoltage: "end voltage",
  termination: "termination",
  duration: "time",
  maxDuration: "longest duration",
  minDuration: "shortest duration",
  purpose: "purpose",
  temperature: "temperature",
  baseCurrent: "base current",
  baseDuration: "base duration",
  pulseCurrent: "pulse current",
  pulseDuration: "pulse duration",
  measurement: "measurement",
  quantity: "quantity",
  frequency: "frequency",
  multipleOfIt: "multiple of It",
  spec: "specification field",
  value: "value",
  unit: "unit",
  nominalC: "nominal",
  toleranceC: "tolerance",
  minC: "lowest",
  maxC: "highest",
  atLeastPercent: "percentage",
  of: "compared with",
  atLeast: "shortest duration",
  atMost: "limit",
  stepId: "step",
  stepIds: "steps",
  maxCycles: "most cycles",
  stopWhenMet: "stop criterion",
  voltagePercent: "voltage tolerance",
  currentPercent: "current tolerance",
  temperatureC: "temperature tolerance",
  timePercent: "time tolerance",
};

const TOP_WORDS: Record<string, string> = {
  instructions: "Instructions",
  cautions: "Safety cautions",
  acknowledgedCautions: "Acknowledged cautions",
  form: "The draft",
  definition: "The procedure",
};

function describePart(part: string): string {
  if (/^\d+$/.test(part)) return String(Number(part) + 1);
  return FIELD_WORDS[part] ?? part.replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase();
}

/** Words for a path inside one step, criterion or the header: "current.multipleOfIt" → "current › multiple of It". */
export function describeInnerPath(path: string): string {
  return path.split(".").map(describePart).join(" › ");
}

const capitalize = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/**
 * Words for a form path: "definition.steps.2.current.value" → "Step 3 › current › value",
 * "definition.header.title" → "Title". Step labels, when given, name the step too.
 */
export function describeFieldPath(path: string, stepLabels: readonly string[] = []): string {
  const parts = path.split(".");
  const [first, second, third, ...rest] = parts;
  if (first !== "definition") return TOP_WORDS[first ?? ""] ?? capitalize(parts.map(describePart).join(" › "));
  if (second === undefined) return TOP_WORDS.definition ?? path;
  const describeRest = (items: string[]) => items.map(describePart);
  switch (second) {
    case "header":
      return capitalize([third ?? "header", ...rest].map(describePart).join(" › "));
    case "steps": {
      if (third === undefined) return "Steps";
      const label = stepLabels[Number(third)];
      const step = `Step ${describePart(third)}${label ? ` “${label}”` : ""}`;
      return [step, ...describeRest(rest)].join(" › ");
    }
    case "acceptance":
      if (third === undefined) return "Acceptance criteria";
      return [`Criterion ${describePart(third)}`, ...describeRest(rest)].join(" › ");
    case "repeat":
      return ["Repeat rule", ...describeRest(third === undefined ? [] : [third, ...rest])].join(" › ");
    default:
      return capitalize(parts.slice(1).map(describePart).join(" › "));
  }
}

/**
 * The server's field errors (keyed by zod path, "form" for the whole draft) as messages to record
 * on the form: one per path, several messages joined; the whole-draft ones under "root.server".
 */
export function listServerErrors(fieldErrors: Readonly<Record<string, readonly string[]>> | undefined): PathMessage[] {
  return Object.entries(fieldErrors ?? {})
    .filter(([, messages]) => messages.length > 0)
    .map(([path, messages]) => ({ path: path === "form" || path === "" ? "root.server" : path, message: messages.join(" ") }));
}

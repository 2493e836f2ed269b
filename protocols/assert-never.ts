/** Compile-time proof that a switch over a discriminated union handled every member. */
export function assertNever(value: never): never {
  throw new Error(`Unhandled case: ${JSON.stringify(value)}`);
}

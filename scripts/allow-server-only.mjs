// Lets a command-line script (the seed, benchmarks) import the app's server-only modules without the
// "react-server" condition, which would also swap React for its server build and break PDF rendering.
// The marker package only guards against bundling server code into a browser; a script is never bundled.
import { register } from "node:module";

register(
  "data:text/javascript," +
    encodeURIComponent(
      'export async function resolve(specifier, context, next) { if (specifier === "server-only") return { url: "data:text/javascript,", shortCircuit: true }; return next(specifier, context); }',
    ),
  import.meta.url,
);

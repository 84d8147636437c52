// Node module hooks for the worker and the operator commands, which run the server modules outside Next.js: the
// "server-only" guard is satisfied (these are server processes), without the react-server condition that would forbid
// rendering e-mails with react-dom/server.
const EMPTY = "data:text/javascript,export {};";

export async function resolve(specifier, context, next) {
  if (specifier === "server-only") return { url: EMPTY, shortCircuit: true };
  return next(specifier, context);
}

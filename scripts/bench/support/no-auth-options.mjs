// Loaded with `tsx --import`: stands in for lib/auth/options.ts in benchmark scripts that call
// server operations directly (the session module imports it only for getServerSession, which
// those scripts never call, and its next-auth providers do not load outside Next's bundler).
import { register } from "node:module";

register(
  "data:text/javascript," +
    encodeURIComponent(`
export async function resolve(specifier, context, next) {
  if (/(^|\\/)auth\\/options(\\.ts)?$/.test(specifier) || (specifier === "./options" && context.parentURL?.includes("/lib/auth/")))
    return { url: "data:text/javascript,export const authOptions = {};", shortCircuit: true };
  return next(specifier, context);
}`),
  import.meta.url,
);

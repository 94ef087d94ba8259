import type { Db } from "@/db/connect";
import { MomentOld } from "@/db/moment-old";
import type { SessionUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";

/**
 * What the route tests put in place of the app's database and the session, so the real route
 * modules run between the HTTP request and PostgreSQL. A test file registers the two modules
 * (Vitest hoists `vi.mock` per file, so the calls stay there) and sets `routeState`:
 *
 *   vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);
 *   vi.mock("@/lib/auth/session", async () => (await import("./route-mocks")).mockedSession);
 */
export const routeState: { db: Db | null; user: SessionUser | null } = { db: null, user: null };

export const mockedDb = {
  get db() {
    return routeState.db;
  },
  /** No replica under the route tests: the moment-old reads go to the test's database. */
  get momentOld() {
    return routeState.db ? new MomentOld(routeState.db, null) : null;
  },
};

export const mockedSession = {
  getSessionUser: async () => routeState.user,
  requireUser: async () => {
    if (!routeState.user) throw new AppError("UNAUTHENTICATED", "Sign in to continue.");
    return routeState.user;
  },
};

import type { Migration } from "kysely";
import * as coreTables from "./2026-12-01T000000-core-tables";
import * as accountsAndAudit from "./2026-12-01T010000-accounts-and-audit";
import * as stressingRecords from "./2026-12-01T020000-stressing-records";
import * as syncChangeCursor from "./2026-12-03T000000-sync-change-cursor";
import * as tendonVersions from "./2026-12-04T000000-tendon-versions";
import * as judgeEachEnd from "./2026-12-10T010000-judge-each-end";

// A static index: vitest and bundlers cannot import .ts migrations from a folder scan.
// Keys sort in time order; append new migrations at the end.
export const migrations: Record<string, Migration> = {
  "2026-12-01T000000-core-tables": coreTables,
  "2026-12-01T010000-accounts-and-audit": accountsAndAudit,
  "2026-12-01T020000-stressing-records": stressingRecords,
  "2026-12-03T000000-sync-change-cursor": syncChangeCursor,
  "2026-12-04T000000-tendon-versions": tendonVersions,
  "2026-12-10T010000-judge-each-end": judgeEachEnd,
};

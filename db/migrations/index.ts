import type { Migration } from "kysely";
import * as coreTables from "./2026-12-01T000000-core-tables";
import * as accountsAndAudit from "./2026-12-01T010000-accounts-and-audit";
import * as stressingRecords from "./2026-12-01T020000-stressing-records";
import * as syncChangeCursor from "./2026-12-03T000000-sync-change-cursor";
import * as tendonVersions from "./2026-12-04T000000-tendon-versions";
import * as judgeEachEnd from "./2026-12-10T010000-judge-each-end";
import * as pourReleaseStates from "./2026-12-10T020000-pour-release-states";
import * as signedReports from "./2026-12-10T030000-signed-reports";
import * as appRole from "./2026-12-10T040000-app-role";
import * as heartbeatAndSessionVersion from "./2026-12-10T040100-dispatcher-heartbeat-and-session-version";
import * as hotPathIndexes from "./2026-12-10T060000-hot-path-indexes";
import * as lateAppendOnlyTables from "./2026-12-10T070000-late-append-only-tables";
import * as governingValue from "./2026-12-10T110000-governing-value";
import * as groupAverageBand from "./2026-12-10T110100-group-average-band";
import * as tailCuts from "./2026-12-10T120000-tail-cuts";
import * as concreteResults from "./2026-12-10T130000-concrete-results";
import * as clockSkewThreshold from "./2026-12-10T140000-clock-skew-threshold";
import * as signedReleases from "./2026-12-10T150000-signed-releases";
import * as calibrationRetirement from "./2026-12-10T150100-calibration-retirement";
import * as allFlagKinds from "./2026-12-10T160000-all-flag-kinds";
import * as liftoffChecks from "./2026-12-10T170000-liftoff-checks";
import * as setDrawIn from "./2026-12-10T170100-set-draw-in";
import * as recordConcreteGoAhead from "./2026-12-10T171300-record-concrete-go-ahead";
import * as oneOpenConcreteFlag from "./2026-12-11T090000-one-open-concrete-flag";
import * as memberWireLedger from "./2026-12-11T100000-member-wire-ledger";
import * as forceAgreement from "./2026-12-12T100000-force-agreement";
import * as recordReread from "./2026-12-12T110000-record-reread";
import * as recordWireBreakDetails from "./2026-12-12T110100-record-wire-break-details";
import * as tendonStressingOrder from "./2026-12-12T110200-tendon-stressing-order";
import * as detensions from "./2026-12-12T120000-detensions";
import * as shiftDigests from "./2026-12-12T130000-shift-digests";
import * as dailyAttestation from "./2026-12-12T140000-daily-attestation";
import * as gaugeOffTarget from "./2026-12-13T100000-gauge-off-target";
import * as referenceNumbers from "./2026-12-13T140000-reference-numbers";
import * as tendonJackingForce from "./2026-12-14T010000-tendon-jacking-force";
import * as pourStatesPerPour from "./2026-12-14T090000-pour-states-per-pour";

// A static index: vitest and bundlers cannot import .ts migrations from a folder scan.
// Keys sort in time order; append new migrations at the end.
export const migrations: Record<string, Migration> = {
  "2026-12-01T000000-core-tables": coreTables,
  "2026-12-01T010000-accounts-and-audit": accountsAndAudit,
  "2026-12-01T020000-stressing-records": stressingRecords,
  "2026-12-03T000000-sync-change-cursor": syncChangeCursor,
  "2026-12-04T000000-tendon-versions": tendonVersions,
  "2026-12-10T010000-judge-each-end": judgeEachEnd,
  "2026-12-10T020000-pour-release-states": pourReleaseStates,
  "2026-12-10T030000-signed-reports": signedReports,
  "2026-12-10T040000-app-role": appRole,
  "2026-12-10T040100-dispatcher-heartbeat-and-session-version": heartbeatAndSessionVersion,
  "2026-12-10T060000-hot-path-indexes": hotPathIndexes,
  "2026-12-10T070000-late-append-only-tables": lateAppendOnlyTables,
  "2026-12-10T110000-governing-value": governingValue,
  "2026-12-10T110100-group-average-band": groupAverageBand,
  "2026-12-10T120000-tail-cuts": tailCuts,
  "2026-12-10T130000-concrete-results": concreteResults,
  "2026-12-10T140000-clock-skew-threshold": clockSkewThreshold,
  "2026-12-10T150000-signed-releases": signedReleases,
  "2026-12-10T150100-calibration-retirement": calibrationRetirement,
  "2026-12-10T160000-all-flag-kinds": allFlagKinds,
  "2026-12-10T170000-liftoff-checks": liftoffChecks,
  "2026-12-10T170100-set-draw-in": setDrawIn,
  "2026-12-10T171300-record-concrete-go-ahead": recordConcreteGoAhead,
  "2026-12-11T090000-one-open-concrete-flag": oneOpenConcreteFlag,
  "2026-12-11T100000-member-wire-ledger": memberWireLedger,
  "2026-12-12T100000-force-agreement": forceAgreement,
  "2026-12-12T110000-record-reread": recordReread,
  "2026-12-12T110100-record-wire-break-details": recordWireBreakDetails,
  "2026-12-12T110200-tendon-stressing-order": tendonStressingOrder,
  "2026-12-12T120000-detensions": detensions,
  "2026-12-12T130000-shift-digests": shiftDigests,
  "2026-12-12T140000-daily-attestation": dailyAttestation,
  "2026-12-13T100000-gauge-off-target": gaugeOffTarget,
  "2026-12-13T140000-reference-numbers": referenceNumbers,
  "2026-12-14T010000-tendon-jacking-force": tendonJackingForce,
  "2026-12-14T090000-pour-states-per-pour": pourStatesPerPour,
};

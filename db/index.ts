/** The storage layer: the only place with SQL. Import from here. */
export {
  KeepclearDb,
  openDatabase,
  inTransaction,
  busyTimeoutFromEnv,
  DEFAULT_BUSY_TIMEOUT_MS,
  type OpenOptions,
} from './connection.js';
export { storageError } from './storageErrors.js';
export { currentOwner, processAlive, type RunOwner } from './owner.js';
export { RUN_KINDS } from './schemaV3.js';
export { defaultDbPath, chooseDbPath } from './paths.js';
export { MIGRATIONS, SCHEMA_VERSION, migrate, schemaVersion, describeDatabase, type Migration } from './migrations.js';
export { getObject, countObjects, setHardBodyRadius, objectsWithDesignator, type StoredObject } from './objects.js';
export {
  storeElementSets,
  latestElementSets,
  latestOrbits,
  elementSetHistory,
  supersededElementSets,
  type StoreResult,
} from './elementSets.js';
export { EPOCH_MATCH_MS, ELEMENT_DIGITS, elementsKey } from './sameElements.js';
export { catalogFingerprint, fingerprintOfCatalogue, fingerprintOfSets, readCatalogue, type CatalogueSnapshot } from './fingerprint.js';
export {
  listImportFiles,
  rejectionsOfImport,
  type ImportFileRef,
  type ImportCounts,
  type ImportFileRecord,
  type StoredRejection,
} from './imports.js';
export {
  createRun,
  finishRun,
  getRun,
  listRuns,
  latestRun,
  markInterruptedRuns,
  setRunDataAt,
  type RunKind,
  type RunStatus,
  type RunRecord,
  type RunOutcome,
} from './runs.js';
export {
  eventsOfRun,
  getEvent,
  updateEventRisk,
  getEventExtra,
  mergeEventExtra,
  eventId,
  type NewEvent,
} from './events.js';
export {
  storeCdm,
  storeCdmFile,
  listCdms,
  getCdm,
  linkCdmToEvent,
  type CdmRecord,
  type StoredCdm,
  type CdmFilter,
} from './cdm.js';
export { getSetting, putSetting, deleteSetting } from './settings.js';
export { SERIES_STATES } from './schemaV4.js';
export {
  LINKED_RUN_KINDS,
  sightingsOfPair,
  sightingsOfRun,
  sightingsOfRunPairs,
  unlinkedPairs,
  setEventSeries,
  putSeries,
  deleteSeries,
  getSeries,
  listSeries,
  eventsOfSeries,
  seriesIdsOfEvents,
  seriesIdsOfRun,
  seriesStates,
  screeningCoverage,
  newestDataAt,
  seriesEventsOf,
  type StoredSeries,
  type SeriesFilter,
  type SeriesEvent,
} from './series.js';
export {
  storeEphemeris,
  storeOemFile,
  listEphemerides,
  getEphemeris,
  loadEphemeris,
  recordRunEphemeris,
  runEphemerides,
  type EphemerisSummary,
  type NewEphemeris,
  type RunEphemeris,
} from './ephemerides.js';
export { getSpacecraft, setSpacecraft, listSpacecraft, type StoredSpacecraft } from './spacecraft.js';
export {
  storePlan,
  getPlan,
  latestPlanOfEvent,
  plansOfEvent,
  latestPlanSummaries,
  type NewPlan,
  type PlanStatus,
  type PlanSummary,
  type PlanTargetRecord,
  type StoredPlan,
} from './plans.js';
export { newestElementEpochMs } from './catalogSummary.js';

/** The public surface of ingest/: pure domain code shared by the server and the app. */
export * from './derive';
export * from './emc';
export * from './emcTarget';
export * from './levels';
export * from './payload';
export * from './postingInterval';
export * from './psychrometrics';
export * from './units';
export * from './hysteresis';
export * from './surfaceEstimate';
export * from './trend';
export * from './wetness';
export * from './alarmKinds';
export * from './alarmRules';
export * from './words';
export * from './importTime';
export * from './importRows';

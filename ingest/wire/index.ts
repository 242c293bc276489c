/**
 * What the HTTP API answers, one file per resource: type-only, plus small constant lists, so
 * the server types its answers and the app imports the same shapes without bundling server code.
 */
export * from './alarms';
export * from './levels';
export * from './live';
export * from './people';
export * from './readings';
export * from './sensors';
export * from './zones';
export * from './reports';
export * from './trials';
export * from './surfaces';
export * from './photos';
export * from './imports';

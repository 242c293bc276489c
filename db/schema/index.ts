/**
 * Drybench's tables, one file per domain. Every row that belongs to a shop carries `shop_id`,
 * so every query can be scoped by shop and the readings table can later be partitioned by time
 * or distributed by shop without a schema change.
 */
export * from './people';
export * from './sensing';
export * from './alarms';
export * from './reports';
export * from './trials';
export * from './care';
export * from './photos';
export * from './rollups';
export * from './imports';

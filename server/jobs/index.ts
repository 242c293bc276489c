/** The public surface of server/jobs: the pg-boss runner and the jobs it runs. */
export {
  ALARM_MAIL_QUEUE,
  createAlarmMailQueue,
  queueAlarmMails,
  workAlarmMails,
  type AlarmMailQueueOptions,
  type AlarmMailWorkerOptions,
} from './alarmMailJob';
export { ALARM_SWEEP_CRON, ALARM_SWEEP_QUEUE, scheduleAlarmSweep } from './alarmSweep';
export {
  DEFAULT_RAW_READINGS_KEEP_MONTHS,
  READING_PARTITIONS_CRON,
  READING_PARTITIONS_QUEUE,
  scheduleReadingPartitionMaintenance,
  type ReadingPartitionsJobOptions,
} from './readingPartitionsJob';
export {
  READING_ROLLUP_CRON,
  READING_ROLLUP_QUEUE,
  runReadingRollup,
  scheduleReadingRollups,
  type ReadingRollupJobOptions,
  type RollupRunOutcome,
} from './readingRollupJob';
export { startJobRunner, type JobRunnerOptions } from './runner';
export {
  createWeekReportQueue,
  scheduleWeekReportMails,
  WEEK_REPORT_CRON,
  WEEK_REPORT_QUEUE,
  type WeekReportJobOptions,
} from './weekReportJob';
export {
  createImportQueue,
  importJobs,
  IMPORT_EXPIRY_CRON,
  IMPORT_EXPIRY_QUEUE,
  IMPORT_QUEUE,
  IMPORT_WORKERS,
  scheduleUploadExpiry,
  workImports,
  type ImportJobs,
  type ImportWorkerOptions,
} from './importJob';
export { createSingletonQueue, scheduleSingletonJob, type SingletonJobSpec } from './singletonJob';

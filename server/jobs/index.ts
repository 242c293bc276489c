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
  IMPORT_QUEUE,
  workImports,
  type ImportJobs,
  type ImportWorkerOptions,
} from './importJob';

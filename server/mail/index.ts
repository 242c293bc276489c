export { startLocalSmtpServer, type LocalSmtpServer } from './localSmtp';
export {
  createMailer,
  type MailAttachment,
  type Mailer,
  type MailMessage,
  type SmtpTarget,
} from './mailer';
export { createOutbox, type Outbox, type StoredAttachment, type StoredMail } from './outbox';
export { outboxRouter } from './outboxPage';
export { alarmMessage, type AlarmMessageInput } from './alarmMessage';
export { weekReportMessage, type WeekReportMessageInput } from './weekReportMessage';
export {
  invitationMail,
  passwordResetMail,
  signUpAttemptMail,
  verificationMail,
  VERIFICATION_SUBJECT,
} from './templates';
export { startMail, type MailSetup } from './setup';

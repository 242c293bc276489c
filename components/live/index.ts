export { applyLiveMessage } from './applyLiveMessage';
export { BACKOFF_BASE_MS, BACKOFF_MAX_MS, backoffDelayMs, liveUrl } from './backoff';
export { FixedLiveStatus, LiveProvider, useLiveStatus } from './LiveProvider';
export { openLiveSocket, type LiveStatus } from './liveSocket';
export {
  parseLiveMessage,
  type LiveAlarmMessage,
  type LiveMessage,
  type LiveReadingMessage,
} from './messages';

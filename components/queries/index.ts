export {
  ApiError,
  NETWORK_ERROR_STATUS,
  apiRequest,
  isApiError,
  isSignedOut,
  type ApiErrorDetail,
} from './api';
export { useFetchMe, useSignInMutation, useSignOutMutation, type SignInInput } from './auth';
export { createQueryClient, shouldRetry } from './client';
export {
  findShop,
  meKeys,
  meQueryOptions,
  useMeQuery,
  type Me,
  type Role,
  type ShopSummary,
  type User,
} from './me';
export {
  DAY_WINDOW,
  appendReadingPoint,
  readingKeys,
  readingsQueryOptions,
  useReadingsQuery,
  withPoint,
  type ReadingPoint,
  type ReadingsResponse,
  type ReadingsWindow,
} from './readings';
export {
  patchZoneLatest,
  useZonesQuery,
  withLatest,
  zoneKeys,
  zonesQueryOptions,
  type LatestReading,
  type SurfaceSource,
  type Zone,
  type ZonesResponse,
} from './zones';
export {
  alarmKeys,
  alarmsQueryOptions,
  patchAlarm,
  useAlarmAckMutation,
  useAlarmsQuery,
  withAlarm,
  type Alarm,
  type AlarmAckInput,
  type AlarmKind,
  type AlarmListState,
  type AlarmsResponse,
} from './alarms';

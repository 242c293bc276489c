export {
  ApiError,
  NETWORK_ERROR_STATUS,
  apiRequest,
  isApiError,
  isSignedOut,
  type ApiErrorDetail,
} from './api';
export {
  startFreshSession,
  useFetchMe,
  usePasswordResetConfirmMutation,
  usePasswordResetRequestMutation,
  useSignInMutation,
  useSignOutMutation,
  useSignUpMutation,
  type SignInInput,
  type SignUpInput,
} from './auth';
export { createQueryClient, shouldRetry } from './client';
export {
  invitationLinkKeys,
  useAcceptInvitationMutation,
  useInvitationLinkQuery,
  type InvitationLink,
} from './invitationLinks';
export {
  findShop,
  meKeys,
  meQueryOptions,
  useMeQuery,
  usePasswordChangeMutation,
  useProfileMutation,
  useUnitPref,
  type Me,
  type Role,
  type ShopSummary,
  type UnitPref,
  type User,
} from './me';
export {
  memberKeys,
  membersQueryOptions,
  useInvitationsQuery,
  useInviteMutation,
  useLeaveShopMutation,
  useMembersQuery,
  useRemoveMemberMutation,
  useRoleMutation,
  useWithdrawInvitationMutation,
  type Invitation,
  type Member,
} from './members';
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
  sensorKeys,
  sensorsQueryOptions,
  useSensorCreateMutation,
  useSensorMoveMutation,
  useSensorRemoveMutation,
  useSensorRevokeMutation,
  useSensorRotateMutation,
  useSensorsQuery,
  type IssuedToken,
  type Sensor,
} from './sensors';
export {
  shopPath,
  useShopCreateMutation,
  useShopDeleteMutation,
  useShopUpdateMutation,
} from './shops';
export {
  patchZoneLatest,
  useZoneCreateMutation,
  useZoneUpdateMutation,
  useZonesQuery,
  withLatest,
  zoneKeys,
  zonesQueryOptions,
  type LatestReading,
  type SurfaceSource,
  type Zone,
  type ZoneChanges,
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

import { useLocalSearchParams } from 'expo-router';

import { TrialScreen } from '@/components/trials/TrialScreen';

export default function ShopTrial() {
  const { trialId } = useLocalSearchParams<{ trialId: string }>();
  return <TrialScreen trialId={trialId} />;
}

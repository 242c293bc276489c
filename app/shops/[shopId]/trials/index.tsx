import { TrialsScreen } from '@/components/trials/TrialsScreen';

export default function ShopTrials() {
  return <TrialsScreen />;
}

import { HomeScreen } from '@/components/HomeScreen';

export default function Index() {
  return <HomeScreen />;
}

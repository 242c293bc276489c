import { HomeScreen } from '@/components/people/HomeScreen';

export default function Index() {
  return <HomeScreen />;
}

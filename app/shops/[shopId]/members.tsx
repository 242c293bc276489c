import { MembersScreen } from '@/components/people/MembersScreen';

export default function Members() {
  return <MembersScreen />;
}

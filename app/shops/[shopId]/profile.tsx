import { ProfileScreen } from '@/components/people/ProfileScreen';

export default function Profile() {
  return <ProfileScreen />;
}

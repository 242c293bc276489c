import { NotFoundScreen } from '@/components/NotFoundScreen';

export default function NotFound() {
  return <NotFoundScreen />;
}

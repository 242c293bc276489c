import { NotFoundScreen } from '@/components/layout';

export default function NotFound() {
  return <NotFoundScreen />;
}

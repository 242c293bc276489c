import { CareScreen } from '@/components/care/CareScreen';

export default function ShopCare() {
  return <CareScreen />;
}

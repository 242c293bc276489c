import { NewShopScreen } from '@/components/NewShopScreen';

export default function NewShop() {
  return <NewShopScreen />;
}

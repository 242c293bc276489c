import { NewShopScreen } from '@/components/shop/NewShopScreen';

export default function NewShop() {
  return <NewShopScreen />;
}

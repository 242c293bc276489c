import { Slot, useLocalSearchParams, usePathname, useSegments } from 'expo-router';

import { ShopFrame, shopFramePageOf } from '@/components/shop/ShopFrame';

/** One frame around every page of a shop; a page renders only its own column. */
export default function ShopLayout() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  // ['shops', '[shopId]', 'alarms', …]: the segment after the shop id names the page.
  const segments: string[] = useSegments();
  const path = usePathname();
  return (
    // A new shop gets a new frame, as it got a new page before: the switcher starts closed.
    <ShopFrame
      key={shopId}
      shopId={shopId}
      page={shopFramePageOf(segments[2], segments[3])}
      path={path}
    >
      <Slot />
    </ShopFrame>
  );
}

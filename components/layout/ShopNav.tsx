import { Link, usePathname } from 'expo-router';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { shopSectionHref, type ShopSection } from '@/components/hrefs';
import { colors, fonts, space } from '@/components/theme';

interface Destination {
  section: ShopSection;
  label: string;
}

/** The destinations of a shop, the same on every page: LOOK.md's four or five. */
export const SHOP_DESTINATIONS: readonly Destination[] = [
  { section: 'zones', label: 'Zones' },
  { section: 'alarms', label: 'Alarms' },
  { section: 'sensors', label: 'Sensors' },
  { section: 'shop', label: 'Shop' },
  { section: 'profile', label: 'Profile' },
];

interface ShopNavProps {
  shopId: string;
  active: ShopSection;
  /** `bar` along the bottom of a phone, `rail` down the left of a wide screen. */
  variant: 'bar' | 'rail';
}

/** Navigation between a shop's pages; the current one is marked for screen readers too. */
export function ShopNav({ shopId, active, variant }: ShopNavProps) {
  // Keep the mark right when a page is reached by a deeper path (a zone under Zones).
  usePathname();
  const rail = variant === 'rail';
  return (
    <View
      role="navigation"
      aria-label="Shop pages"
      style={rail ? styles.rail : styles.bar}
      testID={`shop-nav-${variant}`}
    >
      {rail ? <Text style={styles.brand}>Drybench</Text> : null}
      {SHOP_DESTINATIONS.map(({ section, label }) => {
        const current = section === active;
        return (
          <Link key={section} href={shopSectionHref(shopId, section)} asChild>
            {/* Link's Slot passes style straight to the DOM: one flat object, not an array. */}
            <Pressable
              aria-current={current ? 'page' : undefined}
              accessibilityRole="link"
              accessibilityLabel={label}
              testID={`nav-${section}`}
              style={StyleSheet.flatten([
                styles.item,
                rail ? styles.railItem : styles.barItem,
                current && (rail ? styles.railCurrent : styles.barCurrent),
              ])}
            >
              <Text style={[styles.label, current && styles.labelCurrent]}>{label}</Text>
            </Pressable>
          </Link>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    backgroundColor: colors.card,
    borderTopWidth: 1,
    borderTopColor: colors.border,
  },
  rail: {
    width: 176,
    paddingVertical: space.lg,
    paddingHorizontal: space.md,
    gap: space.xs,
    borderRightWidth: 1,
    borderRightColor: colors.border,
    backgroundColor: colors.paper,
  },
  item: { minHeight: 48, justifyContent: 'center' },
  barItem: {
    flex: 1,
    alignItems: 'center',
    borderTopWidth: 3,
    borderTopColor: 'transparent',
    paddingVertical: space.sm,
  },
  barCurrent: { borderTopColor: colors.ink },
  railItem: {
    paddingHorizontal: space.md,
    borderRadius: 6,
    borderLeftWidth: 3,
    borderLeftColor: 'transparent',
  },
  railCurrent: { backgroundColor: colors.card, borderLeftColor: colors.ink },
  // Sits level with the shop header beside it.
  brand: {
    fontFamily: fonts.bold,
    fontSize: 16,
    color: colors.ink,
    paddingHorizontal: space.md + 3,
    height: 50,
    marginBottom: space.sm,
  },
  label: { fontFamily: fonts.medium, fontSize: 13, color: colors.iron },
  labelCurrent: { color: colors.ink },
});

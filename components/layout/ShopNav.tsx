import { Link, usePathname } from 'expo-router';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { shopSectionHref, type ShopSection } from '@/components/hrefs';
import { colors, fonts, space } from '@/components/theme';

interface Destination {
  section: ShopSection;
  label: string;
}

/** The destinations of a shop, the same on every page (six: each still 65 px wide at 390 px). */
export const SHOP_DESTINATIONS: readonly Destination[] = [
  { section: 'zones', label: 'Zones' },
  { section: 'alarms', label: 'Alarms' },
  { section: 'report', label: 'Report' },
  { section: 'sensors', label: 'Sensors' },
  { section: 'shop', label: 'Shop' },
  { section: 'profile', label: 'Profile' },
];

interface ShopNavProps {
  shopId: string;
  active: ShopSection;
  /** `bar` along the bottom of a phone, `rail` down the left of a wide screen. */
  variant: 'bar' | 'rail';
  /** Open alarms, counted on the Alarms entry ("Alarms 2 open"); none shown at 0. */
  openAlarms?: number;
}

/** Navigation between a shop's pages; the current one is marked for screen readers too. */
export function ShopNav({ shopId, active, variant, openAlarms = 0 }: ShopNavProps) {
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
        const count = section === 'alarms' && openAlarms > 0 ? openAlarms : 0;
        return (
          <Link key={section} href={shopSectionHref(shopId, section)} asChild>
            {/* Link's Slot passes style straight to the DOM: one flat object, not an array. */}
            <Pressable
              aria-current={current ? 'page' : undefined}
              accessibilityRole="link"
              // The name starts with what the entry shows ("Alarms 2"), then says what the number
              // counts: a name that reads the visible words in order (WCAG 2.5.3, label in name).
              accessibilityLabel={count > 0 ? `${label} ${count} open` : label}
              testID={`nav-${section}`}
              style={StyleSheet.flatten([
                styles.item,
                rail ? styles.railItem : styles.barItem,
                current && (rail ? styles.railCurrent : styles.barCurrent),
              ])}
            >
              <View style={styles.labelRow}>
                {/* The space keeps the words apart for whoever reads the text, not the layout:
                    "Alarms 2", not "Alarms2" (axe's label-in-name check reads it so). */}
                <Text style={[styles.label, current && styles.labelCurrent]}>
                  {count > 0 ? `${label} ` : label}
                </Text>
                {count > 0 ? (
                  <Text style={styles.count} testID={`nav-${section}-count`}>
                    {count}
                  </Text>
                ) : null}
              </View>
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
  labelRow: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  // The wet colour with white text: 6.0:1, and the word "open" is in the accessible name.
  count: {
    fontFamily: fonts.bold,
    fontSize: 12,
    lineHeight: 16,
    minWidth: 18,
    paddingHorizontal: 5,
    borderRadius: 9,
    textAlign: 'center',
    color: '#FFFFFF',
    backgroundColor: colors.wet,
    fontVariant: ['tabular-nums'],
  },
  labelCurrent: { color: colors.ink },
});

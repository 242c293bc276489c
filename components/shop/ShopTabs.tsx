import { Link } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { careHref, membersHref, shopSectionHref, trialsHref } from '@/components/hrefs';
import type { ShopSummary } from '@/components/queries';
import { colors, fonts, space, TAP_TARGET_PX } from '@/components/theme';

/** The pages under "Shop": its settings, its members, the care of its surfaces and its trials. */
export function ShopTabs({
  shop,
  current,
}: {
  shop: ShopSummary;
  current: 'settings' | 'members' | 'care' | 'trials';
}) {
  const tabs = [
    { key: 'settings', label: 'Settings', href: shopSectionHref(shop.id, 'shop') },
    { key: 'members', label: 'Members', href: membersHref(shop.id) },
    { key: 'care', label: 'Care', href: careHref(shop.id) },
    { key: 'trials', label: 'Trials', href: trialsHref(shop.id) },
  ] as const;
  return (
    <View style={styles.row} role="tablist" aria-label={`${shop.name} pages`}>
      {tabs.map((tab) => {
        const selected = tab.key === current;
        return (
          <Link
            key={tab.key}
            href={tab.href}
            role="tab"
            aria-selected={selected}
            testID={`tab-${tab.key}`}
            style={[styles.tab, selected && styles.selected]}
          >
            <Text style={[styles.label, selected && styles.selectedLabel]}>{tab.label}</Text>
          </Link>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    gap: space.lg,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  tab: {
    minHeight: TAP_TARGET_PX,
    // "Care" is narrower than a finger: the tab is widened to the tap target, centred.
    minWidth: TAP_TARGET_PX,
    alignItems: 'center',
    justifyContent: 'center',
    paddingVertical: space.sm,
    borderBottomWidth: 3,
    borderBottomColor: 'transparent',
    marginBottom: -1,
  },
  selected: { borderBottomColor: colors.ink },
  label: { fontFamily: fonts.medium, fontSize: 16, color: colors.iron, textAlign: 'center' },
  selectedLabel: { color: colors.ink },
});

import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { shopHref } from '@/components/hrefs';
import { useMeQuery } from '@/components/queries';
import { cardSurface, colors, fonts, space, type } from '@/components/theme';

interface ShopSwitcherProps {
  shopId: string;
  shopName: string;
}

/**
 * The shop's name, and for someone in several shops a button that lists the others; "New
 * shop" is always at the bottom of the list.
 */
export function ShopSwitcher({ shopId, shopName }: ShopSwitcherProps) {
  const router = useRouter();
  const me = useMeQuery();
  const [open, setOpen] = useState(false);
  const others = (me.data?.shops ?? []).filter((s) => s.id !== shopId);

  const go = (href: string) => {
    setOpen(false);
    router.push(href);
  };

  return (
    <View style={styles.wrap}>
      <Pressable
        accessibilityRole="button"
        accessibilityLabel={`Shop: ${shopName}. Switch shop`}
        aria-expanded={open}
        onPress={() => setOpen((v) => !v)}
        testID="shop-switcher"
        style={styles.button}
      >
        <Text style={type.title} numberOfLines={2} testID="shop-name">
          {shopName}
        </Text>
        <Text style={styles.chevron} aria-hidden>
          {open ? '▴' : '▾'}
        </Text>
      </Pressable>
      {open ? (
        <View style={styles.menu} role="menu" testID="shop-switcher-menu">
          {others.map((shop) => (
            <Pressable
              key={shop.id}
              role="menuitem"
              accessibilityLabel={`Switch to ${shop.name} (${shop.role})`}
              onPress={() => go(shopHref(shop.id))}
              style={({ hovered }) => [styles.item, hovered && styles.itemHover]}
            >
              <Text style={type.body}>{shop.name}</Text>
              <Text style={type.small}>{shop.role}</Text>
            </Pressable>
          ))}
          <Pressable
            role="menuitem"
            accessibilityLabel="Create a new shop"
            onPress={() => go('/new-shop')}
            style={({ hovered }) => [styles.item, hovered && styles.itemHover]}
            testID="shop-switcher-new"
          >
            <Text style={[type.body, styles.newShop]}>+ New shop</Text>
          </Pressable>
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { flexShrink: 1, zIndex: 10 },
  button: { flexDirection: 'row', alignItems: 'center', gap: space.sm, alignSelf: 'flex-start' },
  chevron: { fontFamily: fonts.regular, fontSize: 14, color: colors.iron },
  menu: {
    position: 'absolute',
    top: '100%',
    left: 0,
    marginTop: space.xs,
    minWidth: 260,
    ...cardSurface,
    paddingVertical: space.xs,
    shadowColor: colors.ink,
    shadowOpacity: 0.12,
    shadowRadius: 12,
    shadowOffset: { width: 0, height: 4 },
  },
  item: {
    minHeight: 44,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    justifyContent: 'center',
  },
  itemHover: { backgroundColor: colors.paper },
  newShop: { color: colors.air },
});

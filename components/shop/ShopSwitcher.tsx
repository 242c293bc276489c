import { useRouter } from 'expo-router';
import { useEffect, useId, useRef, useState } from 'react';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { shopHref } from '@/components/hrefs';
import { useMeQuery } from '@/components/queries';
import { cardSurface, colors, fonts, space, type } from '@/components/theme';

import { menuKeyAction } from './menuKeys';

interface ShopSwitcherProps {
  shopId: string;
  shopName: string;
}

/** What a focusable element is to the menu: react-native-web's refs are DOM nodes. */
type Focusable = { focus(): void } | null;

/**
 * The shop's name, and for someone in several shops a button that lists the others; "New
 * shop" is always at the bottom of the list. A menu as assistive technology knows it (WAI-ARIA
 * menu button): Enter or Space opens it on its first item, Up/Down/Home/End move, Escape closes
 * it and puts focus back on the button, Tab or a click elsewhere closes it.
 */
export function ShopSwitcher({ shopId, shopName }: ShopSwitcherProps) {
  const router = useRouter();
  const me = useMeQuery();
  const [open, setOpen] = useState(false);
  const others = (me.data?.shops ?? []).filter((s) => s.id !== shopId);
  const menuId = useId();
  const wrap = useRef<View>(null);
  const trigger = useRef<View>(null);
  const items = useRef<Focusable[]>([]);

  const close = (refocus: boolean) => {
    setOpen(false);
    if (refocus) trigger.current?.focus();
  };
  const go = (href: string) => {
    setOpen(false);
    router.push(href);
  };

  // Opened: the first item takes focus, so arrows work at once.
  useEffect(() => {
    if (open) items.current[0]?.focus();
  }, [open]);

  // A press outside the switcher closes the menu (web; a phone's touch ends in the same event).
  useEffect(() => {
    if (!open || typeof document === 'undefined') return;
    const onDown = (event: Event) => {
      const box = wrap.current as unknown as { contains?: (n: unknown) => boolean } | null;
      if (box?.contains && !box.contains(event.target)) setOpen(false);
    };
    document.addEventListener('pointerdown', onDown);
    return () => document.removeEventListener('pointerdown', onDown);
  }, [open]);

  const entries = [
    ...others.map((shop) => ({
      key: shop.id,
      label: `Switch to ${shop.name} (${shop.role})`,
      href: shopHref(shop.id),
      testID: undefined as string | undefined,
      body: (
        <>
          <Text style={type.body}>{shop.name}</Text>
          <Text style={type.small}>{shop.role}</Text>
        </>
      ),
    })),
    {
      key: 'new',
      label: 'Create a new shop',
      href: '/new-shop',
      testID: 'shop-switcher-new',
      body: <Text style={[type.body, styles.newShop]}>+ New shop</Text>,
    },
  ];

  const onMenuKey = (event: { key: string; preventDefault(): void }) => {
    const focused = items.current.findIndex(
      (el) => el !== null && (el as unknown) === globalThis.document?.activeElement,
    );
    const action = menuKeyAction(event.key, focused, entries.length);
    if (action.kind === 'none') return;
    if (action.kind === 'leave') return close(false);
    event.preventDefault();
    if (action.kind === 'close') return close(true);
    items.current[action.index]?.focus();
  };

  return (
    <View style={styles.wrap} ref={wrap}>
      <Pressable
        ref={trigger}
        accessibilityRole="button"
        accessibilityLabel={`Shop: ${shopName}. Switch shop`}
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
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
        <View
          style={styles.menu}
          role="menu"
          nativeID={menuId}
          aria-label="Shops"
          testID="shop-switcher-menu"
          // react-native-web passes keyboard events of the items, bubbling, to the menu; React
          // Native's types know no onKeyDown, and native has no arrow keys to handle.
          {...({ onKeyDown: onMenuKey } as object)}
        >
          {entries.map((entry, i) => (
            <Pressable
              key={entry.key}
              ref={(el) => {
                items.current[i] = el as Focusable;
              }}
              role="menuitem"
              // Roving focus: the arrows move between items, Tab leaves the menu.
              tabIndex={-1}
              accessibilityLabel={entry.label}
              onPress={() => go(entry.href)}
              style={({ hovered }) => [styles.item, hovered && styles.itemHover]}
              testID={entry.testID}
            >
              {entry.body}
            </Pressable>
          ))}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { flexShrink: 1, zIndex: 10 },
  button: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    alignSelf: 'flex-start',
    minHeight: 44,
  },
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

import { useRouter } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { Content } from '@/components/layout';
import { useSignOutMutation } from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { LiveMark } from '@/components/ui';

import { ShopSwitcher } from './ShopSwitcher';

/** The bar across the top of a shop's pages: its name, the live mark and signing out. */
interface ShopHeaderProps {
  shopName: string;
  /** With it, the name opens the shop switcher. */
  shopId?: string;
  /** Lines the header up with the page column below it. */
  maxWidth?: number;
}

export function ShopHeader({ shopName, shopId, maxWidth }: ShopHeaderProps) {
  const router = useRouter();
  const signOut = useSignOutMutation();
  return (
    <View style={styles.bar} role="banner">
      <Content style={styles.row} maxWidth={maxWidth}>
        <View style={styles.titleBlock}>
          {shopId ? (
            <ShopSwitcher shopId={shopId} shopName={shopName} />
          ) : (
            <Text style={type.title} numberOfLines={2} testID="shop-name">
              {shopName}
            </Text>
          )}
          <LiveMark />
        </View>
        <Button
          label="Sign out"
          variant="quiet"
          testID="sign-out"
          disabled={signOut.isPending}
          onPress={() => signOut.mutate(undefined, { onSettled: () => router.replace('/sign-in') })}
        />
      </Content>
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    zIndex: 10,
    backgroundColor: colors.paper,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
    paddingVertical: space.md,
  },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  titleBlock: { flex: 1, gap: 2 },
});

import { Link, type Href } from 'expo-router';
import { StyleSheet } from 'react-native';

import { colors, TAP_TARGET_PX, type } from '@/components/theme';

/** "← All surfaces": the way back from a detail page to its list, a full tap target high. */
export function BackLink({ href, label }: { href: Href; label: string }) {
  return (
    <Link href={href} style={styles.link}>
      ← {label}
    </Link>
  );
}

const styles = StyleSheet.create({
  link: {
    ...type.body,
    color: colors.air,
    alignSelf: 'flex-start',
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.body.lineHeight) / 2,
  },
});

import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Content, FORM_MAX_WIDTH, Screen } from '@/components/layout';
import { cardSurface, colors, space, TAP_TARGET_PX, type } from '@/components/theme';

interface AuthLayoutProps {
  title: string;
  children: ReactNode;
  /** Links under the card ("Create an account", "Back to sign in"). */
  links?: { href: string; label: string; testID?: string }[];
}

/** The narrow page of the signed-out screens: the name of the product, one card, a few links. */
export function AuthLayout({ title, children, links = [] }: AuthLayoutProps) {
  return (
    <Screen>
      <Content maxWidth={FORM_MAX_WIDTH} style={styles.column}>
        <View style={styles.brand}>
          {/* Back to the front page, which says what Drybench is. */}
          <Link href="/" style={styles.home} testID="auth-home">
            Drybench
          </Link>
          <Text style={type.small}>Dew margin and wood moisture for your shop.</Text>
        </View>
        <View style={styles.card}>
          <Text style={type.heading} role="heading" aria-level={1}>
            {title}
          </Text>
          {children}
        </View>
        {links.length > 0 ? (
          <View style={styles.links}>
            {links.map((link) => (
              <Link key={link.href} href={link.href} style={styles.link} testID={link.testID}>
                {link.label}
              </Link>
            ))}
          </View>
        ) : null}
      </Content>
    </Screen>
  );
}

const styles = StyleSheet.create({
  column: { paddingTop: space.xxl, gap: space.xl },
  brand: { gap: space.xs, alignItems: 'flex-start' },
  // The product name is a link home: a full 44 px target like the links below the card.
  home: {
    ...type.title,
    minHeight: TAP_TARGET_PX,
    paddingVertical: Math.max(0, (TAP_TARGET_PX - type.title.lineHeight) / 2),
  },
  card: { ...cardSurface, padding: space.xl, gap: space.lg },
  links: { gap: 0 },
  // Each link is a full-height target (TAP_TARGET_PX), so the list needs no gap of its own.
  link: {
    ...type.body,
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.body.lineHeight) / 2,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
  },
});

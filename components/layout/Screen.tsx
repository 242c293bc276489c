import { useEffect, useRef, type ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';

import { colors, space } from '@/components/theme';
import { FocusRingStyle } from '@/components/ui';

import { Content } from './Content';
import { ScreenTitle } from './ScreenTitle';

interface ScreenProps {
  /** Sits above the scrolling area, across the page column (e.g. the shop header). */
  header?: ReactNode;
  /** Beside the scrolling area on the left (the navigation rail on a wide screen). */
  rail?: ReactNode;
  /** Below the scrolling area, full width (the bottom bar on a phone). */
  footer?: ReactNode;
  children: ReactNode;
  /** A frame kept across pages (the shop's layout) scrolls back to the top when this changes. */
  scrollKey?: string;
  /**
   * The screen's title, its one h1, at the top of the scrolling column. A screen that draws its
   * title itself (AuthLayout's card, the shop frame's column) leaves it out and uses ScreenTitle.
   */
  title?: string;
  testID?: string;
}

/** A page: paper background, safe-area padding, optional fixed header, rail and footer. */
export function Screen({ header, rail, footer, children, scrollKey, title, testID }: ScreenProps) {
  const insets = useSafeAreaInsets();
  const scroll = useRef<ScrollView>(null);
  useEffect(() => {
    scroll.current?.scrollTo({ x: 0, y: 0, animated: false });
  }, [scrollKey]);
  return (
    <View
      style={[styles.page, { paddingTop: insets.top, paddingBottom: footer ? 0 : undefined }]}
      testID={testID}
    >
      <FocusRingStyle />
      <View style={styles.body}>
        {rail}
        {/* The header sits over the page column only, so both line up beside a rail. */}
        <View style={styles.column}>
          {header}
          <ScrollView
            ref={scroll}
            style={styles.scroll}
            contentContainerStyle={[
              styles.scrollContent,
              { paddingBottom: (footer ? 0 : insets.bottom) + space.xxl },
            ]}
          >
            {/* The page's main landmark: a screen-reader user jumps past header and navigation. */}
            <View role="main" style={styles.main}>
              {title ? (
                <Content style={styles.title}>
                  <ScreenTitle>{title}</ScreenTitle>
                </Content>
              ) : null}
              {children}
            </View>
          </ScrollView>
        </View>
      </View>
      {footer ? <View style={{ paddingBottom: insets.bottom }}>{footer}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.paper },
  body: { flex: 1, flexDirection: 'row' },
  column: { flex: 1, minWidth: 0 },
  scroll: { flex: 1 },
  scrollContent: { flexGrow: 1, paddingTop: space.lg },
  main: { flexGrow: 1 },
  title: { paddingBottom: space.lg },
});

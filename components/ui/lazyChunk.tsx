import { Component, lazy, Suspense, type ComponentType, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { colors, TAP_TARGET_PX, type } from '@/components/theme';

/**
 * A component whose code comes as a chunk of its own, fetched when it first renders: what
 * only some screens need (the charts) then stays out of the JavaScript every page loads (see
 * DEVELOPERS.md, "Web bundle"). While the chunk loads, `fallback` stands in; if it fails
 * (offline, a new deploy in between) a line says so with a retry, instead of a blank page.
 */
export function lazyChunk<P extends object>(
  load: () => Promise<ComponentType<P>>,
  fallback: (props: P) => ReactNode,
): ComponentType<P> {
  const fetchChunk = () => load().then((loaded) => ({ default: loaded }));
  let Loaded = lazy(fetchChunk);
  return function LazyChunk(props: P) {
    return (
      <ChunkBoundary
        onRetry={() => {
          // React.lazy keeps a rejected import for good: a new one fetches again.
          Loaded = lazy(fetchChunk);
        }}
      >
        <Suspense fallback={fallback(props)}>
          <Loaded {...props} />
        </Suspense>
      </ChunkBoundary>
    );
  };
}

interface BoundaryProps {
  onRetry: () => void;
  children: ReactNode;
}

class ChunkBoundary extends Component<BoundaryProps, { failed: boolean }> {
  state = { failed: false };

  static getDerivedStateFromError() {
    return { failed: true };
  }

  retry = () => {
    this.props.onRetry();
    this.setState({ failed: false });
  };

  render() {
    if (!this.state.failed) return this.props.children;
    return (
      <View style={styles.failed} testID="chunk-error">
        <Text style={type.body}>This part of the page could not be loaded.</Text>
        <Text role="button" tabIndex={0} onPress={this.retry} style={[type.body, styles.retry]}>
          Try again
        </Text>
      </View>
    );
  }
}

const styles = StyleSheet.create({
  failed: { gap: 4 },
  retry: {
    color: colors.air,
    textDecorationLine: 'underline',
    minHeight: TAP_TARGET_PX,
    minWidth: TAP_TARGET_PX,
    alignSelf: 'flex-start',
    paddingVertical: (TAP_TARGET_PX - type.body.lineHeight) / 2,
  },
});

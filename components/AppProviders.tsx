// Per-weight entry points: the package index would ship all sixteen faces with the app.
import { JetBrainsMono_400Regular } from '@expo-google-fonts/jetbrains-mono/400Regular';
import { JetBrainsMono_500Medium } from '@expo-google-fonts/jetbrains-mono/500Medium';
import { JetBrainsMono_700Bold } from '@expo-google-fonts/jetbrains-mono/700Bold';
import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { useState, type ReactNode } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { LiveProvider } from '@/components/live';
import { createQueryClient } from '@/components/queries';
import { Splash } from '@/components/ui';

/**
 * Everything the screens rely on: the query cache, safe-area insets, the live connection and
 * the JetBrains Mono faces (bundled with the app; no font CDN).
 */
export function AppProviders({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  const [fontsLoaded, fontError] = useFonts({
    JetBrainsMono_400Regular,
    JetBrainsMono_500Medium,
    JetBrainsMono_700Bold,
  });
  // A font that fails to load falls back to the system monospace rather than a blank app.
  const ready = fontsLoaded || fontError !== null;

  return (
    <SafeAreaProvider>
      <QueryClientProvider client={queryClient}>
        <LiveProvider>{ready ? children : <Splash />}</LiveProvider>
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

/**
 * The server's renderer of a shop overview's first screen, bundled by build-web.sh into
 * dist/_ssr/first-screen.cjs (esbuild: react-native → react-native-web, expo-router → the few
 * pieces in firstScreenRouter.tsx) and loaded by server/firstScreen.ts. It renders the app's own
 * components with react-dom/server, and react-native-web's style element with them: the classes
 * its StyleSheet made for this markup.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import * as ReactDomServer from 'react-dom/server';
import { AppRegistry } from 'react-native';

import { FixedLiveStatus } from '@/components/live';
import { createQueryClient, meKeys } from '@/components/queries';
import { FirstScreen } from '@/components/shop/FirstScreen';
import type { FirstScreenInput, FirstScreenMarkup } from '@/ingest/wire/firstScreen';

const APP_KEY = 'FirstScreen';

// react-dom ships no types here; this is the one function of its server build we call.
const { renderToString } = ReactDomServer as unknown as {
  renderToString: (element: React.ReactElement) => string;
};

/** react-native-web's server rendering: the element to render and its style element. */
interface WebApplication {
  element: React.ReactElement;
  getStyleElement: () => React.ReactElement;
}

function Root({ input }: { input: FirstScreenInput }) {
  // useUnitPref and the shop come from /me's answer, as in the app.
  const queryClient = createQueryClient();
  queryClient.setQueryData(meKeys.all, input.me);
  return (
    <QueryClientProvider client={queryClient}>
      <FixedLiveStatus status="connecting">
        <FirstScreen {...input} />
      </FixedLiveStatus>
    </QueryClientProvider>
  );
}

AppRegistry.registerComponent(APP_KEY, () => Root);

export function renderFirstScreen(input: FirstScreenInput): FirstScreenMarkup {
  const app = (
    AppRegistry as unknown as {
      getApplication: (key: string, props: { initialProps: object }) => WebApplication;
    }
  ).getApplication(APP_KEY, { initialProps: { input } });
  // The markup first: rendering it is what fills the style sheet the element then holds.
  const html = renderToString(app.element);
  const css = renderToString(app.getStyleElement());
  return { html, css };
}

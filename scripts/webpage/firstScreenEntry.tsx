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

/** A shop of invented zones with a reading each, only for warming up (never shown). */
function sampleInput(nowMs: number): FirstScreenInput {
  const shop = { id: 'warm-up', name: 'Warm-up', timeZone: 'UTC', role: 'viewer' } as const;
  const zones = (['dry', 'close', 'wet'] as const).map((level, i) => ({
    id: `zone-${i}`,
    name: `Zone ${i}`,
    cautionK: 3,
    wetK: 1,
    humidRhPct: 80,
    purpose: i === 2 ? ('lumber' as const) : ('machines' as const),
    emcRegion: 'most' as const,
    staleAfterS: 3600,
    latest: {
      at: new Date(nowMs - i * 60_000).toISOString(),
      air: 15,
      rh: 60,
      surface: 12 - i,
      dewPoint: 7.3,
      margin: 4.7 - 2 * i,
      emc: 11,
      level,
      surfaceSource: 'probe' as const,
      sensorId: `sensor-${i}`,
    },
  }));
  return {
    me: {
      user: { unitPref: 'C' } as FirstScreenInput['me']['user'],
      shops: [{ ...shop, paperSize: 'a4' } as FirstScreenInput['me']['shops'][number]],
    },
    shopId: shop.id,
    zones,
  };
}

/**
 * Renders an invented shop a few times: the first renders of a fresh process run cold code
 * (measured here: ~60–130 ms of CPU each for the first few, ~5–10 ms once V8 has compiled it),
 * and without this the first people to open the overview after a start would pay for it.
 */
export function warmUp(times: number, nowMs: number): void {
  for (let i = 0; i < times; i++) renderFirstScreen(sampleInput(nowMs));
}

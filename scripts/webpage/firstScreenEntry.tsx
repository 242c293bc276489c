/**
 * The server's renderer of a shop overview's first screen, bundled by build-web.sh into
 * dist/_ssr/first-screen.cjs (esbuild: react-native → react-native-web, expo-router → the few
 * pieces in firstScreenRouter.tsx) and loaded by server/firstScreen.ts. It renders the app's own
 * components with react-dom/server, and react-native-web's style element with them: the classes
 * its StyleSheet made for this markup.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import * as ReactDomServer from 'react-dom/server';
import { AppRegistry, Dimensions } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { BREAKPOINTS } from '@/components/layout';
import { FixedLiveStatus } from '@/components/live';
import { alarmKeys, createQueryClient, meKeys, sensorKeys, zoneKeys } from '@/components/queries';
import { FirstScreen } from '@/components/shop/FirstScreen';
import { LIST_MIN_HEIGHT_PX, WIDE_CHROME_PX } from '@/components/zones/ZoneColumns';
import {
  FIRST_SCREEN_ID,
  type FirstScreenInput,
  type FirstScreenMarkup,
} from '@/ingest/wire/firstScreen';

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

/** No notch or home bar is known on the server; the app pads by the real insets. */
const NO_INSETS = {
  frame: { x: 0, y: 0, width: 0, height: 0 },
  insets: { top: 0, left: 0, right: 0, bottom: 0 },
};

function Root({ input }: { input: FirstScreenInput }) {
  // The queries the frame and the overview read, filled with the answers their GETs get.
  const queryClient = createQueryClient();
  queryClient.setQueryData(meKeys.all, input.me);
  queryClient.setQueryData(zoneKeys.list(input.shopId), { zones: input.zones });
  queryClient.setQueryData(alarmKeys.list(input.shopId, 'open'), { alarms: input.alarms });
  queryClient.setQueryData(sensorKeys.list(input.shopId), input.sensors);
  return (
    <SafeAreaProvider initialMetrics={NO_INSETS}>
      <QueryClientProvider client={queryClient}>
        <FixedLiveStatus status="connecting">
          <FirstScreen {...input} />
        </FixedLiveStatus>
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

/**
 * The widths from which the app lays a shop's page out anew (getBreakpoints: phone, medium,
 * wide). The server does not know the window's: it renders each layout once, at its narrowest
 * width, and the page's CSS shows the one whose range holds the window, so the cards stand where
 * the app's will at any width.
 */
const LAYOUT_MIN_WIDTHS = [0, BREAKPOINTS.medium, BREAKPOINTS.wide];
/** Only the wide list's scrolling box reads the height; LAYOUT_CSS sets it from the window's. */
const RENDER_HEIGHT_PX = 900;

const layoutClass = (i: number) => `${FIRST_SCREEN_ID}-layout-${i}`;

/**
 * Which layout shows at which width (min-width only: `width >= BREAKPOINTS.x`, as the app's
 * test), the wide list's height from the window's as ZoneColumns computes it, and no control
 * that would do nothing before the app runs: buttons keep their place but are not shown; the
 * shop switcher stays as the shop's name.
 */
const LAYOUT_CSS = [
  // min-height 0, as react-native-web gives every View: the page's own scroller scrolls, not this.
  `.${layoutClass(0)},.${layoutClass(1)},.${layoutClass(2)}{flex:1;min-height:0;flex-direction:column;display:none}`,
  `.${layoutClass(0)}{display:flex}`,
  ...LAYOUT_MIN_WIDTHS.slice(1).map(
    (width, i) =>
      `@media (min-width:${width}px){.${layoutClass(i)}{display:none}.${layoutClass(i + 1)}{display:flex}}`,
  ),
  `#${FIRST_SCREEN_ID} [data-testid="zone-list-scroll"]{max-height:max(${LIST_MIN_HEIGHT_PX}px,calc(100vh - ${WIDE_CHROME_PX}px))!important}`,
  `#${FIRST_SCREEN_ID} :is(button,[role="button"]):not([data-testid="shop-switcher"]){visibility:hidden}`,
  `#${FIRST_SCREEN_ID} [data-testid="shop-switcher"]{pointer-events:none}`,
  `#${FIRST_SCREEN_ID} [data-testid="shop-switcher"]>[aria-hidden="true"]{visibility:hidden}`,
].join('');

AppRegistry.registerComponent(APP_KEY, () => Root);

/**
 * React's hoistable style elements (`<style href precedence>`, e.g. FocusRingStyle), which
 * renderToString leaves where they were rendered. The app's React finds one already in the
 * document by its href and keeps it instead of adding its own, so it must not go with the
 * first screen at the handover: it moves to the head, once.
 */
const HOISTED_STYLE = /<style data-precedence="[^"]*" data-href="[^"]*">[\s\S]*?<\/style>/g;

/** react-native-web's window size, which useWindowDimensions (and so useBreakpoints) reads. */
function setWindowWidth(width: number): void {
  const size = { width, height: RENDER_HEIGHT_PX, scale: 1, fontScale: 1 };
  (Dimensions as unknown as { set: (d: object) => void }).set({ window: size, screen: size });
}

export function renderFirstScreen(input: FirstScreenInput): FirstScreenMarkup {
  const app = (
    AppRegistry as unknown as {
      getApplication: (key: string, props: { initialProps: object }) => WebApplication;
    }
  ).getApplication(APP_KEY, { initialProps: { input } });
  // The markup first: rendering it is what fills the style sheet the element then holds.
  const hoisted = new Set<string>();
  const html = LAYOUT_MIN_WIDTHS.map((width, i) => {
    setWindowWidth(width);
    const markup = renderToString(app.element).replace(HOISTED_STYLE, (style) => {
      hoisted.add(style);
      return '';
    });
    return `<div class="${layoutClass(i)}">${markup}</div>`;
  }).join('');
  const css =
    `${renderToString(app.getStyleElement())}${[...hoisted].join('')}` +
    `<style>${LAYOUT_CSS}</style>`;
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
    alarms: [],
    sensors: { sensors: [], mqtt: null },
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

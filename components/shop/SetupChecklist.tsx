import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { shopSectionHref } from '@/components/hrefs';
import { useSensorsQuery, useZonesQuery, type ShopSummary } from '@/components/queries';
import { colors, fonts, radius, space, type } from '@/components/theme';
import { Panel } from '@/components/ui';

interface Step {
  key: 'zone' | 'sensor' | 'reading';
  title: string;
  why: string;
  done: boolean;
  href: string;
  action: string;
}

/**
 * What a new shop needs before it shows anything: a zone, a sensor in it, its first reading.
 * Ticked from the zone and sensor lists, which the live socket keeps current (a reading patches
 * the zone list; a new zone or sensor invalidates its list), so a step ticks as it happens —
 * in this tab or another. Shown to owners, who alone can do the first two, until all are done.
 */
function useSetupSteps(shop: ShopSummary): Step[] | null {
  const zones = useZonesQuery(shop.id);
  const sensors = useSensorsQuery(shop.id);
  if (!zones.data || !sensors.data) return null;
  const zoneList = zones.data.zones;
  const sensorList = sensors.data.sensors;
  return [
    {
      key: 'zone',
      title: 'Add a zone',
      why: 'An area with its own air: the machine room, the lumber rack.',
      done: zoneList.length > 0,
      href: shopSectionHref(shop.id, 'shop'),
      action: 'Add a zone in shop settings',
    },
    {
      key: 'sensor',
      title: 'Add a sensor',
      why: 'A hygrometer in the zone, ideally with a probe on the iron; it gets a token to post with.',
      done: sensorList.length > 0,
      href: shopSectionHref(shop.id, 'sensors'),
      action: 'Add a sensor',
    },
    {
      key: 'reading',
      title: 'First reading received',
      why: 'The sensor posts its first reading with its token; the sensors page shows how.',
      done:
        zoneList.some((zone) => zone.latest !== null) ||
        sensorList.some((sensor) => sensor.lastSeenAt !== null),
      href: shopSectionHref(shop.id, 'sensors'),
      action: 'See how a sensor posts',
    },
  ];
}

/** The getting-started steps above the overview (`children`) until they are all done. */
export function SetupChecklist({ shop, children }: { shop: ShopSummary; children: ReactNode }) {
  const steps = useSetupSteps(shop);
  const show = shop.role === 'owner' && steps !== null && steps.some((step) => !step.done);
  const next = steps?.find((step) => !step.done)?.key;
  return (
    <>
      {show ? (
        <Panel
          title="Getting started"
          hint="Three steps from a new shop to its first dew margin."
          testID="setup-checklist"
        >
          <View role="list" style={styles.list}>
            {steps.map((step, index) => (
              <View
                key={step.key}
                role="listitem"
                style={styles.step}
                testID={`setup-step-${step.key}`}
              >
                <View style={[styles.mark, step.done && styles.markDone]}>
                  <Text style={[styles.markText, step.done && styles.markTextDone]}>
                    {step.done ? '✓' : index + 1}
                  </Text>
                </View>
                <View style={styles.body}>
                  <View style={styles.titleRow}>
                    <Text style={type.heading}>{step.title}</Text>
                    <Text
                      style={[type.label, step.done ? styles.doneWord : undefined]}
                      testID={`setup-step-${step.key}-state`}
                    >
                      {step.done ? 'done' : step.key === next ? 'next' : 'to do'}
                    </Text>
                  </View>
                  {step.done ? null : (
                    <>
                      <Text style={type.small}>{step.why}</Text>
                      <Link
                        href={step.href}
                        style={[styles.link, step.key === next && styles.linkNext]}
                        testID={`setup-step-${step.key}-link`}
                      >
                        {step.action} →
                      </Link>
                    </>
                  )}
                </View>
              </View>
            ))}
          </View>
        </Panel>
      ) : null}
      {children}
    </>
  );
}

const MARK = 28;

const styles = StyleSheet.create({
  list: { gap: space.md },
  step: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  mark: {
    width: MARK,
    height: MARK,
    borderRadius: MARK / 2,
    borderWidth: 1,
    borderColor: colors.iron,
    alignItems: 'center',
    justifyContent: 'center',
  },
  markDone: { backgroundColor: colors.dry, borderColor: colors.dry },
  markText: { fontFamily: fonts.bold, fontSize: 13, color: colors.iron },
  markTextDone: { color: colors.card },
  body: { flex: 1, minWidth: 0, gap: space.xs },
  titleRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'baseline', gap: space.md },
  doneWord: { color: colors.dry },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
    // 20 px of line and 12 px above and below: a 44 px target.
    paddingVertical: space.md,
  },
  linkNext: {
    color: colors.card,
    backgroundColor: colors.ink,
    textDecorationLine: 'none',
    paddingHorizontal: space.md,
    paddingVertical: space.md,
    borderRadius: radius.control,
    fontFamily: fonts.medium,
  },
});

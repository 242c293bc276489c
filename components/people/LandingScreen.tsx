import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Content, Screen, useBreakpoints } from '@/components/layout';
import {
  cardSurface,
  colors,
  fonts,
  levelWords,
  radius,
  space,
  tabular,
  type,
} from '@/components/theme';
import { useDocumentTitle } from '@/components/ui';
import { CAUTIONS, formatMargin, formatPercent, formatTemperature } from '@/ingest/words';

/** A column of the page a little narrower than the app's, so lines stay readable. */
const LANDING_MAX_WIDTH = 1080;

const DOES: { title: string; text: string }[] = [
  {
    title: 'Watches the dew margin',
    text: 'How far each machine top sits above the dew point of the air around it, live, zone by zone. Water condenses on iron at or below that point; the margin says how close it is.',
  },
  {
    title: 'Alarms before iron sweats',
    text: 'When the margin is falling towards the wet limit, Drybench warns early enough to act — heat slowly, run the dehumidifier, cover or wipe the tops — and records who answered.',
  },
  {
    title: 'Keeps lumber at its moisture',
    text: 'From the air’s temperature and humidity it works out the moisture content stored wood settles at, so you glue up and finish when the air allows.',
  },
  {
    title: 'Sends a weekly report',
    text: 'Hours wet, the closest approach to the dew point, alarms and how fast they were answered, for you and the people you work with.',
  },
];

const NEEDS: { title: string; text: string; tag: string }[] = [
  {
    tag: 'each zone',
    title: 'A hygrometer',
    text: 'Air temperature and relative humidity, one in each area with its own air: the machine room, the lumber rack.',
  },
  {
    tag: 'ideally',
    title: 'A surface probe on the iron',
    text: 'A temperature probe under or against a machine top. Without one, Drybench estimates the surface from the air’s recent history and says so.',
  },
  {
    tag: 'to send',
    title: 'Anything that can make an HTTPS POST',
    text: 'A small board, a data logger, a script on a computer in the shop. Each sensor gets a token and posts a few numbers of JSON every few minutes.',
  },
];

/** The front door for someone signed out: what Drybench does, what a shop needs, a way in. */
export function LandingScreen() {
  useDocumentTitle('Keep cast iron and lumber dry');
  const { isWide } = useBreakpoints();
  return (
    <Screen testID="landing">
      <Content maxWidth={LANDING_MAX_WIDTH} style={styles.page}>
        <View style={styles.bar}>
          <Text style={type.title}>Drybench</Text>
          <Link href="/sign-in" style={styles.barLink} testID="landing-sign-in-top">
            Sign in
          </Link>
        </View>

        <View style={[styles.hero, isWide && styles.heroWide]}>
          <View style={[styles.heroText, isWide && styles.flexColumn]}>
            <Text style={styles.headline} role="heading" aria-level={1}>
              Keep cast-iron tops and stored lumber dry.
            </Text>
            <Text style={styles.lead}>
              Drybench reads small sensors in your shop and watches the dew margin — the distance
              between a machine top’s temperature and the dew point of the air. It raises an alarm
              before the iron sweats, and sends a report of the week.
            </Text>
            <View style={styles.actions}>
              <Link
                href="/sign-up"
                style={[styles.button, styles.primary]}
                testID="landing-sign-up"
              >
                Create an account
              </Link>
              <Link href="/sign-in" style={[styles.button, styles.quiet]} testID="landing-sign-in">
                Sign in
              </Link>
            </View>
          </View>
          <ExampleCard />
        </View>

        <View style={[styles.sections, isWide && styles.sectionsWide]}>
          <Section title="What it does" testID="landing-does">
            {DOES.map((item) => (
              <Point key={item.title} title={item.title} text={item.text} />
            ))}
          </Section>
          <Section title="What your shop needs" testID="landing-needs">
            {NEEDS.map((item) => (
              <Point key={item.title} title={item.title} text={item.text} tag={item.tag} />
            ))}
            <Text style={type.small}>{CAUTIONS.sensorPower}</Text>
          </Section>
        </View>
      </Content>
    </Screen>
  );
}

/**
 * A zone card as the app draws one (LOOK.md: name, level word, the margin largest), with
 * invented numbers, so the first thing seen is the number Drybench is about.
 */
function ExampleCard() {
  return (
    <View style={styles.example} aria-label="An example zone card" testID="landing-example">
      <View style={styles.exampleTop}>
        <Text style={type.heading}>Machine room</Text>
        <Text style={[type.label, { color: colors.close }]}>{levelWords.close}</Text>
      </View>
      <Text style={type.small}>dew margin</Text>
      <Text style={[type.hero, tabular, { color: colors.close }]}>{formatMargin(1.8)}</Text>
      <View style={styles.exampleGrid}>
        <Figure label="saw top" value={formatTemperature(9.4)} />
        <Figure label="dew point" value={formatTemperature(7.6)} />
        <Figure label="air" value={formatTemperature(12.1)} />
        <Figure label="RH" value={formatPercent(74)} />
      </View>
      <Text style={type.small}>Example: wet in about 40 min unless the shop is warmed slowly.</Text>
    </View>
  );
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.figure}>
      <Text style={type.small}>{label}</Text>
      <Text style={[type.body, tabular]}>{value}</Text>
    </View>
  );
}

function Section({
  title,
  testID,
  children,
}: {
  title: string;
  testID: string;
  children: ReactNode;
}) {
  return (
    <View style={styles.section} testID={testID}>
      <Text style={styles.sectionTitle} role="heading" aria-level={2}>
        {title}
      </Text>
      {children}
    </View>
  );
}

function Point({ title, text, tag }: { title: string; text: string; tag?: string }) {
  return (
    <View style={styles.point}>
      <View style={styles.pointTitle}>
        <Text style={type.heading}>{title}</Text>
        {tag ? <Text style={styles.tag}>{tag}</Text> : null}
      </View>
      <Text style={type.body}>{text}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { gap: space.xxl, paddingBottom: space.xxl },
  bar: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center' },
  barLink: { ...type.body, color: colors.air, textDecorationLine: 'underline', padding: space.md },
  hero: { gap: space.xl },
  heroWide: { flexDirection: 'row', alignItems: 'center', gap: space.xxl },
  heroText: { gap: space.lg },
  flexColumn: { flex: 1, minWidth: 0 },
  headline: { fontFamily: fonts.bold, fontSize: 30, lineHeight: 38, color: colors.ink },
  lead: { ...type.body, fontSize: 16, lineHeight: 24 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  button: {
    fontFamily: fonts.medium,
    fontSize: 15,
    lineHeight: 20,
    paddingHorizontal: space.xl,
    paddingVertical: space.md,
    borderRadius: radius.control,
    borderWidth: 1,
    textAlign: 'center',
  },
  primary: { backgroundColor: colors.ink, borderColor: colors.ink, color: colors.card },
  quiet: { borderColor: colors.iron, color: colors.ink },
  example: {
    ...cardSurface,
    borderLeftWidth: 4,
    borderLeftColor: colors.close,
    padding: space.xl,
    gap: space.xs,
    width: '100%',
    maxWidth: 380,
    alignSelf: 'center',
  },
  exampleTop: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center' },
  exampleGrid: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    rowGap: space.sm,
    marginVertical: space.sm,
  },
  figure: { width: '50%', gap: 2 },
  sections: { gap: space.xxl },
  sectionsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  section: { flex: 1, minWidth: 0, gap: space.lg },
  sectionTitle: {
    ...type.title,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
    paddingBottom: space.sm,
  },
  point: { gap: space.xs },
  pointTitle: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  tag: {
    ...type.label,
    color: colors.ink,
    backgroundColor: colors.border,
    paddingHorizontal: space.sm,
    borderRadius: radius.control,
  },
});

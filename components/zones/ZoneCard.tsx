import { Link } from 'expo-router';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { formatLastSeen, formatMargin } from '@/components/format';
import { useUnitPref, type Zone } from '@/components/queries';
import { cardSurface, colors, levelColors, space, tabular, type } from '@/components/theme';
import { Flash, useNow } from '@/components/ui';

import { LevelMark } from './LevelMark';
import { MarginBar } from './MarginBar';
import { ZoneReadings } from './ZoneReadings';

interface ZoneCardProps {
  zone: Zone;
  /** The shop's IANA zone, for times older than a few hours. */
  timeZone: string;
  /** When given, the whole card is a link (the zone list). */
  href?: string;
  /** Marks the zone shown beside the list on a wide screen. */
  selected?: boolean;
}

/** One zone at a glance: level, dew margin (largest), the readings behind it, last seen. */
export function ZoneCard({ zone, timeZone, href, selected = false }: ZoneCardProps) {
  const unit = useUnitPref();
  const latest = zone.latest;
  const level = latest?.level ?? 'unknown';
  const margin = formatMargin(latest?.margin, unit);
  const body = (
    <View style={styles.inner}>
      <View style={[styles.rule, { backgroundColor: levelColors[level] }]} />
      <View style={styles.top}>
        <Text
          style={[type.heading, styles.name]}
          numberOfLines={2}
          role="heading"
          aria-level={2}
          testID="zone-name"
        >
          {zone.name}
        </Text>
        <LevelMark level={level} testID="zone-level" />
      </View>

      <Flash value={margin} style={styles.hero}>
        <Text style={[type.hero, tabular]} testID="zone-margin">
          {margin}
        </Text>
        <Text style={type.small}>dew margin</Text>
      </Flash>

      <MarginBar
        marginK={latest?.margin ?? null}
        wetK={zone.wetK}
        cautionK={zone.cautionK}
        unit={unit}
      />

      <ZoneReadings latest={latest} unit={unit} />

      <LastSeen at={latest?.at ?? null} timeZone={timeZone} />
    </View>
  );

  const cardStyle = [styles.card, selected && styles.selected];
  if (!href) {
    return (
      <View style={cardStyle} testID="zone-card">
        {body}
      </View>
    );
  }
  return (
    <Link href={href} asChild>
      {/* Link's Slot passes style straight to the DOM: a style function is dropped and an
          array throws, so the card gets one flat object here. */}
      {/* Named by what it shows, its zone name first: a shorter label than the visible text
          would leave a person who speaks what they see unable to name it (WCAG 2.5.3). */}
      <Pressable
        style={StyleSheet.flatten(cardStyle)}
        testID="zone-card"
        accessibilityRole="link"
        aria-current={selected ? 'page' : undefined}
      >
        {body}
      </Pressable>
    </Link>
  );
}

function LastSeen({ at, timeZone }: { at: string | null; timeZone: string }) {
  const now = useNow();
  return (
    <Text style={type.small} testID="zone-last-seen">
      {at ? `Last reading ${formatLastSeen(at, now, timeZone)}` : 'No readings yet'}
    </Text>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, overflow: 'hidden' },
  selected: { borderColor: colors.iron },
  inner: {
    paddingVertical: space.lg,
    paddingLeft: space.lg + 6,
    paddingRight: space.lg,
    gap: space.md,
  },
  rule: { position: 'absolute', left: 0, top: 0, bottom: 0, width: 5 },
  top: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  name: { flex: 1 },
  hero: { alignSelf: 'flex-start', paddingHorizontal: space.xs, marginLeft: -space.xs },
});

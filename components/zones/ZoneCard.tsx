import { Link } from 'expo-router';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { formatLastSeen, formatMargin } from '@/components/format';
import { emcTargetBand } from '@/ingest/emcTarget';
import { useUnitPref, type Zone } from '@/components/queries';
import {
  cardSurface,
  colors,
  levelColors,
  fonts,
  space,
  staleColors,
  tabular,
  type,
} from '@/components/theme';
import { Flash, useNow } from '@/components/ui';
import { isStale } from '@/ingest/postingInterval';
import { lastReadingText, STALE_READING_NOTE } from '@/ingest/words';

import { EmcLead } from './EmcLead';
import { LevelMark } from './LevelMark';
import { MarginBar } from './MarginBar';
import { leadFigure } from './zoneLead';
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

/**
 * One zone at a glance: level, the lead figure (largest: the dew margin, or a lumber zone's wood
 * EMC against its target band, see zoneLead.ts), the readings behind it, last seen.
 */
export function ZoneCard({ zone, timeZone, href, selected = false }: ZoneCardProps) {
  const unit = useUnitPref();
  const now = useNow();
  const latest = zone.latest;
  // A stale reading says nothing of now: the card greys and its level shows as unknown.
  const stale = latest !== null && isStale(Date.parse(latest.at), zone.staleAfterS, now);
  const level = stale ? 'unknown' : (latest?.level ?? 'unknown');
  const margin = formatMargin(latest?.margin, unit);
  const lead = leadFigure(zone.purpose);
  const band = emcTargetBand(zone.emcRegion);
  const body = (
    <View style={styles.inner}>
      <View
        style={[styles.rule, { backgroundColor: stale ? staleColors.rule : levelColors[level] }]}
      />
      <View style={styles.top}>
        <Text
          style={[type.heading, styles.name]}
          numberOfLines={2}
          testID="zone-name"
          role="heading"
          aria-level={2}
        >
          {zone.name}
        </Text>
        <LevelMark level={level} testID="zone-level" />
      </View>

      {lead === 'emc' ? (
        <EmcLead emcPct={latest?.emc ?? null} band={band} />
      ) : (
        <>
          <Flash value={margin} style={styles.hero}>
            <Text style={[type.hero, tabular, stale && styles.staleFigure]} testID="zone-margin">
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
        </>
      )}

      <ZoneReadings
        latest={latest}
        unit={unit}
        humidRhPct={zone.humidRhPct}
        show={lead === 'emc' ? 'margin' : 'emc'}
      />

      <LastSeen at={latest?.at ?? null} timeZone={timeZone} now={now} stale={stale} />
    </View>
  );

  const cardStyle = [styles.card, stale && styles.stale, selected && styles.selected];
  if (!href) {
    return (
      <View style={cardStyle} testID="zone-card" data-stale={stale ? 'true' : undefined}>
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

interface LastSeenProps {
  at: string | null;
  timeZone: string;
  now: number;
  stale: boolean;
}

function LastSeen({ at, timeZone, now, stale }: LastSeenProps) {
  return (
    <View style={styles.lastSeen}>
      <Text style={[type.small, stale && styles.staleAge]} testID="zone-last-seen">
        {at ? lastReadingText(formatLastSeen(at, now, timeZone)) : 'No readings yet'}
      </Text>
      {stale ? (
        <Text style={type.small} testID="zone-stale">
          {STALE_READING_NOTE}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, overflow: 'hidden' },
  selected: { borderColor: colors.iron },
  stale: { backgroundColor: staleColors.card, borderColor: staleColors.border },
  staleFigure: { color: staleColors.figure },
  staleAge: { fontFamily: fonts.medium, color: colors.ink },
  lastSeen: { gap: 2 },
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

import { StyleSheet, Text, View } from 'react-native';

import { Choice, FormError } from '@/components/forms';
import { useZoneUpdateMutation, type Zone } from '@/components/queries';
import { space, type } from '@/components/theme';
import { emcTargetBand } from '@/ingest/emcTarget';
import { EMC_REGIONS, ZONE_PURPOSES } from '@/ingest/wire/zones';
import { bandRange, EMC_REGION_WORDS, EMC_TARGET_SOURCE, PURPOSE_WORDS } from '@/ingest/words';

const PURPOSE_OPTIONS = ZONE_PURPOSES.map((value) => ({ value, label: PURPOSE_WORDS[value] }));
const REGION_OPTIONS = EMC_REGIONS.map((value) => ({
  value,
  label: `${EMC_REGION_WORDS[value]} (${bandRange(emcTargetBand(value))})`,
}));

/**
 * What a zone holds, and for lumber the region of its wood target band. Each choice is saved
 * when it is made, as the unit on Profile is: there is nothing to type, so nothing to confirm.
 */
export function ZonePurposeForm({ shopId, zone }: { shopId: string; zone: Zone }) {
  const update = useZoneUpdateMutation(shopId);
  return (
    <View style={styles.box}>
      <Choice
        label={`What ${zone.name} holds`}
        options={PURPOSE_OPTIONS}
        value={zone.purpose}
        disabled={update.isPending}
        onChange={(purpose) => update.mutate({ zoneId: zone.id, purpose })}
        testID="zone-edit-purpose"
      />
      {zone.purpose === 'lumber' ? (
        <>
          <Choice
            label="Region of the wood target band"
            options={REGION_OPTIONS}
            value={zone.emcRegion}
            disabled={update.isPending}
            onChange={(emcRegion) => update.mutate({ zoneId: zone.id, emcRegion })}
            testID="zone-edit-region"
          />
          <Text style={type.small}>
            The card leads with the wood EMC the air gives against this band. Source:{' '}
            {EMC_TARGET_SOURCE}.
          </Text>
        </>
      ) : (
        <Text style={type.small}>
          Lumber zones lead with wood EMC; machine, finishing and general zones with the dew margin.
        </Text>
      )}
      <FormError message={update.error?.message} />
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
});

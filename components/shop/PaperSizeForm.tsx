import { StyleSheet, Text, View } from 'react-native';

import { Choice, FormError } from '@/components/forms';
import { useShopUpdateMutation, type ShopSummary } from '@/components/queries';
import { space, type } from '@/components/theme';
import { PAPER_SIZES } from '@/ingest/wire/reports';
import { PAPER_SIZE_DETAILS, PAPER_SIZE_WORDS } from '@/ingest/words';

const PAPER_OPTIONS = PAPER_SIZES.map((value) => ({ value, label: PAPER_SIZE_WORDS[value] }));

/**
 * The sheet the week report's PDF is laid out on. Saved when chosen, as a zone's purpose is:
 * there is nothing to type, so nothing to confirm.
 */
export function PaperSizeForm({ shop }: { shop: ShopSummary }) {
  const update = useShopUpdateMutation(shop.id);
  return (
    <View style={styles.box}>
      <Choice
        label="Report paper"
        options={PAPER_OPTIONS}
        value={shop.paperSize}
        disabled={update.isPending}
        onChange={(paperSize) => update.mutate({ paperSize })}
        testID="shop-edit-paper"
      />
      <Text style={type.small}>
        The week report’s PDF is laid out on {PAPER_SIZE_WORDS[shop.paperSize]} (
        {PAPER_SIZE_DETAILS[shop.paperSize]}).
      </Text>
      <FormError message={update.error?.message} />
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
});

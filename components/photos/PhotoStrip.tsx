import type { QueryKey } from '@tanstack/react-query';
import { useState } from 'react';
import { Image, Modal, Pressable, ScrollView, StyleSheet, Text, View } from 'react-native';

import { Button, ConfirmButton, FormError } from '@/components/forms';
import { usePhotoDeleteMutation, type Photo } from '@/components/queries';
import { colors, radius, space, type } from '@/components/theme';

/** Thumbnails are drawn this high; the width follows each photo's own proportions. */
const THUMB_HEIGHT_PX = 72;

export interface PhotoStripProps {
  shopId: string;
  photos: readonly Photo[];
  /** Each photo's text alternative, written by the caller who knows what it shows. */
  altOf: (photo: Photo, index: number) => string;
  /** Whether the person looking may delete this photo (an owner, or the member who added it). */
  canDelete: (photo: Photo) => boolean;
  /** The query whose answer lists these photos, refreshed after a delete. */
  refresh: QueryKey;
  testID?: string;
}

/**
 * A row of thumbnails (through the checked proxy, so only the shop's people see them). Tapping
 * one opens the full photo over the page; the overlay has a Close button and closes on Escape.
 */
export function PhotoStrip({ shopId, photos, altOf, canDelete, refresh, testID }: PhotoStripProps) {
  const [open, setOpen] = useState<number | null>(null);
  const remove = usePhotoDeleteMutation(shopId, refresh);
  if (photos.length === 0) return null;
  const shown = open === null ? null : photos[open];
  return (
    <View style={styles.strip} testID={testID}>
      <View style={styles.row}>
        {photos.map((photo, i) => (
          <View key={photo.id} style={styles.item}>
            <Pressable
              accessibilityRole="button"
              aria-label={`${altOf(photo, i)}: open full size`}
              onPress={() => setOpen(i)}
              style={styles.thumbButton}
              testID={testID ? `${testID}-thumb` : undefined}
            >
              <Image
                source={{ uri: photo.thumbUrl }}
                accessibilityLabel={altOf(photo, i)}
                style={[
                  styles.thumb,
                  { width: (THUMB_HEIGHT_PX * photo.widthPx) / Math.max(photo.heightPx, 1) },
                ]}
              />
            </Pressable>
            {canDelete(photo) ? (
              <ConfirmButton
                label="Delete"
                question="Delete this photo?"
                accessibilityLabel={`Delete ${altOf(photo, i)}`}
                disabled={remove.isPending}
                onConfirm={() => remove.mutate(photo.id)}
                testID={testID ? `${testID}-delete` : undefined}
              />
            ) : null}
          </View>
        ))}
      </View>
      <FormError message={remove.error?.message} />
      <Modal
        visible={shown !== null && shown !== undefined}
        transparent
        animationType="none"
        onRequestClose={() => setOpen(null)}
      >
        {shown ? (
          <View style={styles.overlay} testID={testID ? `${testID}-overlay` : undefined}>
            <ScrollView contentContainerStyle={styles.overlayContent}>
              <View style={styles.sheet}>
                <Image
                  source={{ uri: shown.url }}
                  accessibilityLabel={altOf(shown, open!)}
                  resizeMode="contain"
                  style={[
                    styles.full,
                    { aspectRatio: shown.widthPx / Math.max(shown.heightPx, 1) },
                  ]}
                />
                <View style={styles.sheetFoot}>
                  <Text style={[type.body, styles.caption]}>{altOf(shown, open!)}</Text>
                  <Button label="Close" onPress={() => setOpen(null)} />
                </View>
              </View>
            </ScrollView>
          </View>
        ) : null}
      </Modal>
    </View>
  );
}

const styles = StyleSheet.create({
  strip: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  item: { gap: space.xs, alignItems: 'flex-start' },
  thumbButton: { borderRadius: radius.control, overflow: 'hidden' },
  thumb: {
    height: THUMB_HEIGHT_PX,
    minWidth: 44,
    borderRadius: radius.control,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.card,
  },
  overlay: { flex: 1, backgroundColor: 'rgba(31, 36, 39, 0.92)' },
  overlayContent: {
    flexGrow: 1,
    alignItems: 'center',
    justifyContent: 'center',
    padding: space.lg,
    gap: space.md,
  },
  // The photo on a card, so its caption and Close read as the rest of the app does.
  sheet: {
    width: '100%',
    maxWidth: 1024,
    gap: space.md,
    padding: space.md,
    borderRadius: radius.card,
    backgroundColor: colors.card,
  },
  full: { width: '100%', borderRadius: radius.control },
  sheetFoot: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
  },
  caption: { flexShrink: 1 },
});

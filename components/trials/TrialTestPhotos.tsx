import { StyleSheet, View } from 'react-native';

import { PhotoPicker } from '@/components/photos/PhotoPicker';
import { PhotoStrip } from '@/components/photos/PhotoStrip';
import {
  photoPaths,
  trialKeys,
  useMeQuery,
  type Photo,
  type ShopSummary,
  type TrialTest,
} from '@/components/queries';
import { space } from '@/components/theme';

interface TrialTestPhotosProps {
  shop: ShopSummary;
  trialId: string;
  test: TrialTest;
}

/**
 * A trial test's photos inside its panel: the thumbnails for everyone in the shop, "Add a
 * photo" for owners and members, and a delete for an owner or the member who added the photo.
 */
export function TrialTestPhotos({ shop, trialId, test }: TrialTestPhotosProps) {
  const me = useMeQuery().data?.user.id;
  const refresh = trialKeys.one(shop.id, trialId);
  const writer = shop.role !== 'viewer';
  const canDelete = (photo: Photo) =>
    shop.role === 'owner' || (writer && me !== undefined && photo.addedById === me);
  return (
    <View style={styles.photos}>
      <PhotoStrip
        shopId={shop.id}
        photos={test.photos}
        altOf={(_photo, i) => `Photo ${i + 1} of ${test.name}`}
        canDelete={canDelete}
        refresh={refresh}
        testID="trial-test-photos"
      />
      {writer ? (
        <PhotoPicker
          path={photoPaths.trialTest(shop.id, trialId, test.id)}
          refresh={refresh}
          accessibilityLabel={`Add a photo to ${test.name}`}
          testID="trial-test-photo-add"
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({ photos: { gap: space.sm, marginTop: space.sm } });

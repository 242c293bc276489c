import type { QueryKey } from '@tanstack/react-query';
import { StyleSheet, View } from 'react-native';

import { useMeQuery, type Photo, type ShopSummary } from '@/components/queries';
import { space } from '@/components/theme';

import { PhotoPicker } from './PhotoPicker';
import { PhotoStrip } from './PhotoStrip';

interface SubjectPhotosProps {
  shop: ShopSummary;
  photos: readonly Photo[];
  /** The API path that takes a new photo of this subject (photoPaths.careEntry / trialTest). */
  uploadPath: string;
  /** The query that lists the photos, refetched after an upload or a delete. */
  refresh: QueryKey;
  /** What the photos show, for their names: "Saw top, inspection of 3 March". */
  subjectName: string;
  testID: string;
}

/**
 * The photos of one thing (a care entry, a trial test): thumbnails for everyone in the shop,
 * "Add a photo" for owners and members, and a delete for an owner or the member who added it —
 * the same rule the server holds (DELETE …/photos/:photoId).
 */
export function SubjectPhotos({
  shop,
  photos,
  uploadPath,
  refresh,
  subjectName,
  testID,
}: SubjectPhotosProps) {
  const me = useMeQuery().data?.user.id;
  const writer = shop.role !== 'viewer';
  const canDelete = (photo: Photo) =>
    shop.role === 'owner' || (writer && me !== undefined && photo.addedById === me);
  return (
    <View style={styles.photos}>
      <PhotoStrip
        shopId={shop.id}
        photos={photos}
        altOf={(_photo, i) => `Photo ${i + 1} of ${subjectName}`}
        canDelete={canDelete}
        refresh={refresh}
        testID={`${testID}-photos`}
      />
      {writer ? (
        <PhotoPicker
          path={uploadPath}
          refresh={refresh}
          accessibilityLabel={`Add a photo to ${subjectName}`}
          testID={`${testID}-photo-add`}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({ photos: { gap: space.sm, marginTop: space.sm } });

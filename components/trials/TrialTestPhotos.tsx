import { SubjectPhotos } from '@/components/photos/SubjectPhotos';
import { photoPaths, trialKeys, type ShopSummary, type TrialTest } from '@/components/queries';

interface TrialTestPhotosProps {
  shop: ShopSummary;
  trialId: string;
  test: TrialTest;
}

/** A trial test's photos inside its panel, refreshed through the trial's own query. */
export function TrialTestPhotos({ shop, trialId, test }: TrialTestPhotosProps) {
  return (
    <SubjectPhotos
      shop={shop}
      photos={test.photos}
      uploadPath={photoPaths.trialTest(shop.id, trialId, test.id)}
      refresh={trialKeys.one(shop.id, trialId)}
      subjectName={test.name}
      testID="trial-test"
    />
  );
}

import type { QueryKey } from '@tanstack/react-query';

import { FilePicker } from '@/components/forms';
import { usePhotoUploadMutation } from '@/components/queries';

export interface PhotoPickerProps {
  /** Where the photo goes: photoPaths.careEntry(…) or photoPaths.trialTest(…). */
  path: string;
  /** The query whose answer lists the subject's photos, refreshed after an upload. */
  refresh: QueryKey;
  /** The button's accessible name when "Add a photo" alone does not say to what. */
  accessibilityLabel?: string;
  testID?: string;
}

/**
 * "Add a photo": an image picked and sent with the session at once (the shared FilePicker;
 * native builds say to use a browser). A refusal shows the server's own sentence (too large,
 * not an image, storage away).
 */
export function PhotoPicker({ path, refresh, accessibilityLabel, testID }: PhotoPickerProps) {
  const upload = usePhotoUploadMutation(path, refresh);
  return (
    <FilePicker
      accept="image/*"
      label="Add a photo"
      accessibilityLabel={accessibilityLabel}
      variant="quiet"
      send={(file) => upload.mutate({ file, filename: file.name || 'photo.jpg' })}
      pending={upload.isPending}
      error={upload.isError ? upload.error.message : null}
      uploading={() => 'Uploading…'}
      browserOnly="Photos can be added from Drybench in a browser."
      testID={testID}
    />
  );
}

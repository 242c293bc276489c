import type { QueryKey } from '@tanstack/react-query';
import { Text } from 'react-native';

import { type } from '@/components/theme';

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
 * Native builds have no file picker without a package the app does not ship; the web twin
 * (PhotoPicker.web.tsx) picks and uploads. Saying so beats a button that does nothing.
 */
export function PhotoPicker({ testID }: PhotoPickerProps) {
  return (
    <Text style={type.small} testID={testID}>
      Photos can be added from Drybench in a browser.
    </Text>
  );
}

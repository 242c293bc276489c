import { Text } from 'react-native';

import type { ImportUploaded } from '@/components/queries';
import { type } from '@/components/theme';
import { IMPORT_WORDS } from '@/ingest/words';

export interface ImportFilePickerProps {
  shopId: string;
  sensorId: string;
  /** The label of the button: "Choose a CSV file", or "Choose another file" after one. */
  label: string;
  onUploaded: (answer: ImportUploaded) => void;
  testID?: string;
}

/**
 * Native builds have no file picker without a package the app does not ship; the web twin
 * (ImportFilePicker.web.tsx) picks and uploads. Saying so beats a button that does nothing.
 */
export function ImportFilePicker({ testID }: ImportFilePickerProps) {
  return (
    <Text style={type.small} testID={testID}>
      {IMPORT_WORDS.browserOnly}
    </Text>
  );
}

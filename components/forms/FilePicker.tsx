import { Text } from 'react-native';

import { type } from '@/components/theme';

export interface FilePickerProps {
  /** The input's accept list (extensions and media types). */
  accept: string;
  /** The button's words. */
  label: string;
  /** The button's accessible name when the label alone does not say to what. */
  accessibilityLabel?: string;
  /** The button's look until a file is picked; after one it is quiet. */
  variant: 'primary' | 'quiet';
  /** Sends the picked file (a mutation); called again with the same file by "Try again". */
  send: (file: File) => void;
  /** The upload is under way: the button waits and `uploading` is announced. */
  pending: boolean;
  /** The server's sentence when the upload was refused; null otherwise. */
  error: string | null;
  /** What is announced while the file goes up. */
  uploading: (file: File) => string;
  /** The accessible name of "Try again", when it should name the file. */
  retryAccessibilityLabel?: (file: File) => string;
  /** What a native build says instead (it has no file picker). */
  browserOnly: string;
  /** The button's; the input, status, error and retry add -input, -status, -error, -retry. */
  testID?: string;
}

/**
 * Native builds have no file picker without a package the app does not ship; the web twin
 * (FilePicker.web.tsx) picks and uploads. Saying so beats a button that does nothing.
 */
export function FilePicker({ browserOnly, testID }: FilePickerProps) {
  return (
    <Text style={type.small} testID={testID}>
      {browserOnly}
    </Text>
  );
}

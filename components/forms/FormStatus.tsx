import { Text } from 'react-native';

import { type } from '@/components/theme';

/** What a form's last submit achieved ("Saved."), announced as a status; nothing until then. */
export function FormStatus({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <Text style={type.small} role="status">
      {message}
    </Text>
  );
}

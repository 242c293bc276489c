import { StyleSheet, View } from 'react-native';

import type { FormProps } from './Form';

/**
 * A real <form>, so browsers and password managers recognise the sign-in fields. The browser's
 * own submit is cancelled: the page must not reload, and the form submits through `onSubmit`.
 */
export function Form({ onSubmit, children, style }: FormProps) {
  return (
    <form
      style={{ display: 'contents' }}
      onSubmit={(event) => {
        event.preventDefault();
        onSubmit();
      }}
    >
      <View style={StyleSheet.flatten(style)}>{children}</View>
    </form>
  );
}

import { StyleSheet, View } from 'react-native';

import type { FormProps } from './Form';

/**
 * A real <form>, so browsers and password managers recognise the sign-in fields. The browser's
 * own submit is cancelled: the page must not reload, and the form submits through `onSubmit`.
 * The hidden submit button is what lets Enter in any field submit (a form of several fields
 * submits implicitly only through a submit button; the app's buttons are not <button>s).
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
      <button type="submit" hidden tabIndex={-1} />
    </form>
  );
}

import type { ReactNode } from 'react';
import { View, type StyleProp, type ViewStyle } from 'react-native';

export interface FormProps {
  onSubmit: () => void;
  children: ReactNode;
  style?: StyleProp<ViewStyle>;
}

/** Groups a form's fields. On the web (Form.web.tsx) it is a real <form> for password managers. */
export function Form({ children, style }: FormProps) {
  return <View style={style}>{children}</View>;
}

import { Button } from './Button';

interface SubmitButtonProps {
  /** What the button does: "Save shop". */
  label: string;
  /** What it says while the request is on its way: "Saving…". */
  sendingLabel: string;
  sending: boolean;
  onPress: () => void;
  variant?: 'primary' | 'quiet';
  testID?: string;
}

/**
 * The button that sends a form. While sending it says so and cannot be pressed again, so a
 * double click never sends twice.
 */
export function SubmitButton({ label, sendingLabel, sending, ...button }: SubmitButtonProps) {
  return <Button {...button} label={sending ? sendingLabel : label} disabled={sending} />;
}

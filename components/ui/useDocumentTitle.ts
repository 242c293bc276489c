import { useEffect } from 'react';
import { Platform } from 'react-native';

/** Names the browser tab after the page: "Machine room · Demo shop · Drybench". */
export function useDocumentTitle(...parts: (string | undefined)[]): void {
  const title = [...parts.filter(Boolean), 'Drybench'].join(' · ');
  useEffect(() => {
    if (Platform.OS === 'web' && typeof document !== 'undefined') document.title = title;
  }, [title]);
}

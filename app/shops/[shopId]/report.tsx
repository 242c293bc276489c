import { useLocalSearchParams } from 'expo-router';

import { parseWeekStart } from '@/components/report/reportWeek';
import { ReportScreen } from '@/components/report/ReportScreen';

export default function ShopReport() {
  // ?week=YYYY-MM-DD (a Monday): the week shown, so a reload or a shared link keeps it.
  const { week } = useLocalSearchParams<{ week?: string }>();
  return <ReportScreen week={parseWeekStart(week)} />;
}

import { Link } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useDaySheet } from '@/features/field/api/get-day-sheet';
import { DaySheetView } from '@/features/field/components/day-sheet-view';
import { longDate } from '@/features/field/components/labels';

/** The crew's home (today) and the day sheet of any date: the same page. */
export function DayPage({ date }: { date: string | 'today' }) {
  const sheet = useDaySheet(date);
  if (sheet.isPending) return <PageSpinner label="Loading the day sheet…" />;
  if (sheet.isError) {
    return (
      <Alert tone="danger" title="The day sheet could not be loaded.">
        {errorMessage(sheet.error)}
      </Alert>
    );
  }
  const today = date === 'today';
  return (
    <>
      <PageHeader
        title={today ? `Today, ${longDate(sheet.data.date)}` : `Day sheet, ${longDate(sheet.data.date)}`}
        documentTitle={today ? 'Today' : `Day sheet ${sheet.data.date}`}
        description={`${sheet.data.stops.length} stop${sheet.data.stops.length === 1 ? '' : 's'}. Times are local (${sheet.data.timeZone}).`}
        actions={
          <Link className={`${linkClasses} text-sm print:hidden`} to={paths.app.fieldCalendar.getHref()}>
            My calendar feed
          </Link>
        }
      />
      <DaySheetView sheet={sheet.data} />
    </>
  );
}

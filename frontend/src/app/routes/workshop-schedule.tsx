import { SchedulePage } from '@/features/workshop/components/schedule-page';

export function Component() {
  return (
    <>
      <title>Schedule · Workshop · Loamline</title>
      <SchedulePage />
    </>
  );
}

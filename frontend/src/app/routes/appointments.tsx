import { AppointmentsPage } from '@/features/booking/components/appointments-page';

export function Component() {
  return (
    <>
      <title>My appointments · Loamline</title>
      <AppointmentsPage />
    </>
  );
}

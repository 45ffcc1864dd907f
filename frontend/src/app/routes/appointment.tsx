import { AppointmentPage } from '@/features/booking/components/appointment-page';

export function Component() {
  return (
    <>
      <title>Appointment · Loamline</title>
      <AppointmentPage />
    </>
  );
}

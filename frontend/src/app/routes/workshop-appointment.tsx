import { AppointmentPage } from '@/features/workshop/components/appointment-page';

export function Component() {
  return (
    <>
      <title>Appointment · Workshop · Loamline</title>
      <AppointmentPage />
    </>
  );
}

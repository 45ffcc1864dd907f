import { PaymentsPage } from '@/features/payments/components/payments-page';

export function Component() {
  return (
    <>
      <title>Payments · Workshop · Loamline</title>
      <PaymentsPage />
    </>
  );
}

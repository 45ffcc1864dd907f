import { RequestsPage } from '@/features/workshop/components/requests-page';

export function Component() {
  return (
    <>
      <title>Requests · Workshop · Loamline</title>
      <RequestsPage />
    </>
  );
}

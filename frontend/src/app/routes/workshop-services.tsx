import { ServicesPage } from '@/features/workshop/components/services-page';

export function Component() {
  return (
    <>
      <title>Services · Workshop · Loamline</title>
      <ServicesPage />
    </>
  );
}

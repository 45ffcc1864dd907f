import { ShopsPage } from '@/features/booking/components/shops-page';

export function Component() {
  return (
    <>
      <title>Shops · Loamline</title>
      <ShopsPage />
    </>
  );
}

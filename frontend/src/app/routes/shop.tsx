import { ShopPage } from '@/features/booking/components/shop-page';

export function Component() {
  return (
    <>
      <title>Shop · Loamline</title>
      <ShopPage />
    </>
  );
}

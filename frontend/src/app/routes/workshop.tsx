import { WorkshopHomePage } from '@/features/workshop/components/workshop-home-page';

export function Component() {
  return (
    <>
      <title>Workshop · Loamline</title>
      <WorkshopHomePage />
    </>
  );
}

import { GaragePage } from '@/features/garage/components/garage-page';

export function Component() {
  return (
    <>
      <title>My garage · Loamline</title>
      <GaragePage />
    </>
  );
}

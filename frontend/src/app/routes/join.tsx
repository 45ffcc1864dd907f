import { JoinPage } from '@/features/auth/components/join-page';

export function Component() {
  return (
    <>
      <title>Join a shop · Loamline</title>
      <JoinPage />
    </>
  );
}

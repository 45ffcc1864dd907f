import { SignInPage } from '@/features/auth/components/sign-in-page';

export function Component() {
  return (
    <>
      <title>Sign in · Loamline</title>
      <SignInPage />
    </>
  );
}

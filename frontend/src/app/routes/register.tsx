import { RegisterPage } from '@/features/auth/components/register-page';

export function Component() {
  return (
    <>
      <title>Create an account · Loamline</title>
      <RegisterPage />
    </>
  );
}

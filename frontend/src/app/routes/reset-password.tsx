import { ResetPasswordPage } from '@/features/auth/components/reset-password-page';

export function Component() {
  return (
    <>
      <title>New password · Loamline</title>
      <ResetPasswordPage />
    </>
  );
}

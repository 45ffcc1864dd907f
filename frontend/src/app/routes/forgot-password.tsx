import { ForgotPasswordPage } from '@/features/auth/components/forgot-password-page';

export function Component() {
  return (
    <>
      <title>Forgot password · Loamline</title>
      <ForgotPasswordPage />
    </>
  );
}

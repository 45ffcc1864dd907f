import { SettingsPage } from '@/features/workshop/components/settings-page';

export function Component() {
  return (
    <>
      <title>Hours & rules · Workshop · Loamline</title>
      <SettingsPage />
    </>
  );
}

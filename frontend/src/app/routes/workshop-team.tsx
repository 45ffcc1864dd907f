import { TeamPage } from '@/features/workshop/components/team-page';

export function Component() {
  return (
    <>
      <title>Team · Workshop · Loamline</title>
      <TeamPage />
    </>
  );
}

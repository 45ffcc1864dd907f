import { SheetsPage } from '@/features/baseline-sheets/components/sheets-page';

export function Component() {
  return (
    <>
      <title>Baseline sheets · Loamline</title>
      <SheetsPage />
    </>
  );
}

import { SheetPage } from '@/features/baseline-sheets/components/sheet-page';

export function Component() {
  return (
    <>
      <title>Baseline sheet · Loamline</title>
      <SheetPage />
    </>
  );
}

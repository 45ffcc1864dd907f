import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import type { DataGridProps, GridValidRowModel } from '@mui/x-data-grid';
import { lazy, Suspense, type ComponentProps, type ReactElement } from 'react';

/*
 * MUI X Data Grid is the largest library of the app (about 115 kB gzipped): a page with a grid
 * (Workshop › Requests, › Payments) draws its heading and filters at once and fetches the grid beside
 * its data, so the route's own JavaScript leaves the grid out (docs/performance.md, "First screen").
 */
const DataGrid = lazy(() => import('@mui/x-data-grid/DataGrid').then((m) => ({ default: m.DataGrid })));
const GridActionsCellItem = lazy(() =>
  import('@mui/x-data-grid/components').then((m) => ({ default: m.GridActionsCellItem })),
);

/** A row's action (GridActionsCellItem), usable in `getActions` before the grid's code has arrived. */
export function GridAction(props: ComponentProps<typeof GridActionsCellItem>): ReactElement {
  return <GridActionsCellItem {...props} />;
}

/** The data grid, loaded on first use; until then rows of placeholders the grid's size. */
export function LazyDataGrid<R extends GridValidRowModel>(
  props: DataGridProps<R> & { 'aria-label': string },
) {
  return (
    <Suspense
      fallback={
        <Stack spacing={0.5} role="status" aria-label={`Loading: ${props['aria-label']}`} sx={{ p: 1 }}>
          {Array.from({ length: 6 }, (_, i) => (
            <Skeleton key={i} variant="rounded" height={i === 0 ? 40 : 48} />
          ))}
        </Stack>
      }
    >
      <DataGrid {...(props as DataGridProps)} />
    </Suspense>
  );
}

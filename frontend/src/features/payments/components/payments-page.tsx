import ReceiptLongIcon from '@mui/icons-material/ReceiptLong';
import UndoIcon from '@mui/icons-material/Undo';
import Alert from '@mui/material/Alert';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Grid from '@mui/material/Grid';
import Skeleton from '@mui/material/Skeleton';
import Snackbar from '@mui/material/Snackbar';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import type { GridColDef, GridColumnVisibilityModel, GridRowParams } from '@mui/x-data-grid';
import type { PaymentDayTotal, WorkshopPaymentRow, WorkshopPayments } from '@loamline/shared-types';
import { lazy, Suspense, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router';
import { GridAction, LazyDataGrid } from '@/components/ui/lazy-data-grid';
import { LoadError } from '@/components/ui/load-error';
import { useSession } from '@/features/auth/api/get-me';
import { useTeam } from '@/features/workshop/api/get-team';
import { WorkshopShell } from '@/features/workshop/components/workshop-shell';

// the date pickers and Luxon only once the page is drawn (docs/performance.md, "First screen")
const DayRange = lazy(() => import('./day-range'));
import { ApiRequestError } from '@/lib/api-client';
import { useWorkshopPayments } from '../api/workshop-payments';
import { formatMoney, formatRefund } from '../utils/money';
import { paymentStatusWords, refundableMinor } from '../utils/payment-words';
import { PaymentDetailsDialog } from './payment-details-dialog';
import { RefundDialog } from './refund-dialog';

const OWNER_ONLY = 'Payments are for the shop’s owner. Ask them if you need a refund made.';

/** An instant in the shop's zone, short: "3 Dec 2026, 14:05". */
const when = (iso: string, zone: string) =>
  new Intl.DateTimeFormat(undefined, { timeZone: zone, dateStyle: 'medium', timeStyle: 'short' }).format(
    new Date(iso),
  );
/** A local day YYYY-MM-DD: "Thu 3 Dec 2026". */
const dayLabel = (day: string) =>
  new Intl.DateTimeFormat(undefined, {
    timeZone: 'UTC',
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
  }).format(new Date(`${day}T12:00:00Z`));

function Total({
  label,
  minor,
  currency,
  refund,
}: {
  label: string;
  minor: number;
  currency: string;
  refund?: boolean;
}) {
  return (
    <Card sx={{ height: '100%' }}>
      <CardContent>
        <Typography variant="body2" color="text.secondary">
          {label}
        </Typography>
        <Typography sx={{ fontSize: '1.5rem', fontWeight: 700, fontVariantNumeric: 'tabular-nums' }}>
          {refund && minor > 0 ? formatRefund(minor, currency) : formatMoney(minor, currency)}
        </Typography>
      </CardContent>
    </Card>
  );
}

/** How many payments and refunds a day had: left out on a phone, where the money needs the room. */
const countCell = { display: { xs: 'none', sm: 'table-cell' } } as const;

function DayTotals({ days, currency }: { days: PaymentDayTotal[]; currency: string }) {
  const money = (m: number) => formatMoney(m, currency);
  return (
    <Card component="section" aria-labelledby="days-title">
      <CardContent>
        <Typography id="days-title" variant="h3" component="h2" sx={{ fontSize: '1.05rem', mb: 1 }}>
          By day
        </Typography>
        {days.length === 0 ? (
          <Typography color="text.secondary">No money moved in these days.</Typography>
        ) : (
          // wider than a phone: it scrolls sideways, so it takes the focus for the arrow keys
          <TableContainer tabIndex={0} role="group" aria-labelledby="days-title">
            <Table
              size="small"
              aria-labelledby="days-title"
              sx={{ '& th, & td': { whiteSpace: 'nowrap', px: { xs: 1, sm: 2 } } }}
            >
              <TableHead>
                <TableRow>
                  <TableCell>Day</TableCell>
                  <TableCell align="right" sx={countCell}>
                    Payments
                  </TableCell>
                  <TableCell align="right">Received</TableCell>
                  <TableCell align="right" sx={countCell}>
                    Refunds
                  </TableCell>
                  <TableCell align="right">Refunded</TableCell>
                  <TableCell align="right">Net</TableCell>
                </TableRow>
              </TableHead>
              <TableBody sx={{ '& td': { fontVariantNumeric: 'tabular-nums' } }}>
                {days.map((d) => (
                  <TableRow key={d.day}>
                    <TableCell component="th" scope="row">
                      {dayLabel(d.day)}
                    </TableCell>
                    <TableCell align="right" sx={countCell}>
                      {d.payments}
                    </TableCell>
                    <TableCell align="right">{money(d.paidMinor)}</TableCell>
                    <TableCell align="right" sx={countCell}>
                      {d.refunds}
                    </TableCell>
                    <TableCell align="right">
                      {d.refundedMinor > 0 ? formatRefund(d.refundedMinor, currency) : money(0)}
                    </TableCell>
                    <TableCell align="right">{money(d.netMinor)}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </TableContainer>
        )}
      </CardContent>
    </Card>
  );
}

/** Left out on a phone (the details dialog has them all). */
const PHONE_HIDDEN: GridColumnVisibilityModel = {
  paidMinor: false,
  refundedMinor: false,
  status: false,
  serviceName: false,
  start: false,
  paidAt: false,
};

function PaymentsGrid({
  data,
  zone,
  onDetails,
  onRefund,
}: {
  data: WorkshopPayments;
  zone: string;
  onDetails: (row: WorkshopPaymentRow) => void;
  onRefund: (row: WorkshopPaymentRow) => void;
}) {
  const money = (m: number | null | undefined) => (m == null ? '' : formatMoney(m, data.currency));
  const theme = useTheme();
  // a phone: who, what the shop keeps, and the actions fit the screen; a tap on a row opens the
  // details with everything else (and Refund…). The desktop grid keeps every column.
  const phone = useMediaQuery(theme.breakpoints.down('sm'), { noSsr: true });
  const columnVisibilityModel = useMemo(
    (): GridColumnVisibilityModel => (phone ? PHONE_HIDDEN : {}),
    [phone],
  );
  const columns = useMemo<GridColDef<WorkshopPaymentRow>[]>(
    () => [
      {
        field: 'rider',
        headerName: 'Rider',
        flex: 1,
        minWidth: 96,
        valueGetter: (_v, row) => row.rider.name,
      },
      {
        field: 'paidMinor',
        headerName: 'Paid',
        type: 'number',
        minWidth: 100,
        valueFormatter: (v: number) => money(v),
      },
      {
        field: 'refundedMinor',
        headerName: 'Refunded',
        type: 'number',
        minWidth: 100,
        valueFormatter: (v: number) => (v > 0 ? formatRefund(v, data.currency) : money(0)),
      },
      {
        field: 'netMinor',
        headerName: 'Net',
        type: 'number',
        minWidth: 100,
        valueFormatter: (v: number) => money(v),
      },
      {
        field: 'status',
        headerName: 'Status',
        minWidth: 130,
        valueGetter: (_v, row) => paymentStatusWords(row),
      },
      { field: 'serviceName', headerName: 'Service', flex: 1, minWidth: 140 },
      {
        field: 'start',
        headerName: 'Appointment',
        type: 'dateTime',
        minWidth: 170,
        valueGetter: (_v, row) => new Date(row.start),
        valueFormatter: (_v, row) => when(row.start, zone),
      },
      {
        field: 'paidAt',
        headerName: 'Paid at',
        type: 'dateTime',
        minWidth: 170,
        valueGetter: (_v, row) => (row.paidAt ? new Date(row.paidAt) : null),
        valueFormatter: (_v, row) => (row.paidAt ? when(row.paidAt, zone) : '—'),
      },
      {
        field: 'actions',
        type: 'actions',
        headerName: 'Actions',
        width: 100,
        getActions: ({ row }) => [
          <GridAction
            key="details"
            icon={<ReceiptLongIcon />}
            label={`Details of ${row.rider.name}’s payment`}
            onClick={() => onDetails(row)}
          />,
          <GridAction
            key="refund"
            icon={<UndoIcon />}
            label={`Refund ${row.rider.name}`}
            disabled={refundableMinor(row) <= 0}
            onClick={() => onRefund(row)}
          />,
        ],
      },
    ],
    // `money` is derived from the currency
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [data.currency, zone, onDetails, onRefund],
  );
  return (
    <LazyDataGrid
      aria-label="Payments"
      rows={data.rows}
      columns={columns}
      density="compact"
      autoHeight
      disableRowSelectionOnClick
      columnVisibilityModel={columnVisibilityModel}
      onRowClick={(p: GridRowParams<WorkshopPaymentRow>) => onDetails(p.row)}
      initialState={{
        sorting: { sortModel: [{ field: 'paidAt', sort: 'desc' }] },
        pagination: { paginationModel: { pageSize: 25 } },
      }}
      pageSizeOptions={[25, 50, 100]}
      localeText={{ noRowsLabel: 'No payments in these days.' }}
      sx={{ bgcolor: 'background.paper', '& .MuiDataGrid-row': { cursor: 'pointer' } }}
    />
  );
}

/** `/workshop/payments` (owner): money in and out over a range of days, each payment, refunds. */
export function PaymentsPage() {
  const { user } = useSession();
  const team = useTeam();
  const [params, setParams] = useSearchParams();
  const from = params.get('from');
  const to = params.get('to');
  const badRange = !!from && !!to && from > to;
  const owner = user?.role === 'owner';
  const { data, error, mutate } = useWorkshopPayments(
    owner && !badRange ? { from, to } : { from: null, to: null },
  );
  const zone = team.data?.shop.timeZone ?? 'UTC';
  const [details, setDetails] = useState<WorkshopPaymentRow | null>(null);
  const [refunding, setRefunding] = useState<WorkshopPaymentRow | null>(null);
  const [done, setDone] = useState<string | null>(null);
  // the rows as last answered (a refund updates them)
  const rowById = (id: string) => data?.rows.find((r) => r.id === id);

  const setRange = (which: 'from' | 'to', isoDate: string) => {
    const next = new URLSearchParams(params);
    next.set(which, isoDate);
    if (which === 'from' && !next.get('to') && data) next.set('to', data.to);
    if (which === 'to' && !next.get('from') && data) next.set('from', data.from);
    setParams(next, { replace: true });
  };

  if (user && !owner)
    return (
      <WorkshopShell>
        <Alert severity="info">{OWNER_ONLY}</Alert>
      </WorkshopShell>
    );

  const forbidden = error instanceof ApiRequestError && error.status === 403;
  const shownFrom = from ?? data?.from ?? null;
  const shownTo = to ?? data?.to ?? null;
  return (
    <WorkshopShell maxWidth="xl">
      <Stack spacing={2.5}>
        <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ alignItems: { md: 'center' } }}>
          <Typography variant="h2" sx={{ fontSize: '1.35rem', flexGrow: 1 }}>
            Payments
          </Typography>
          <Suspense
            fallback={
              <Skeleton variant="rounded" width={300} height={40} aria-label="Loading the day pickers" />
            }
          >
            <DayRange from={shownFrom} to={shownTo} onChange={setRange} />
          </Suspense>
        </Stack>
        <Typography variant="body2" color="text.secondary">
          Days in the shop&apos;s time ({zone}). Money received and refunded on each day; a refund counts on
          the day it was made.
        </Typography>
        {badRange && (
          <Alert severity="warning">The first day is after the last one: pick the days again.</Alert>
        )}
        {forbidden ? (
          <Alert severity="info">{OWNER_ONLY}</Alert>
        ) : error ? (
          <LoadError what="Payments" error={error} onRetry={() => void mutate()} />
        ) : !data ? (
          <Stack spacing={2}>
            <Skeleton variant="rounded" height={90} />
            <Skeleton variant="rounded" height={320} />
          </Stack>
        ) : (
          <>
            <Grid container spacing={2} component="section" aria-label="Totals for these days">
              <Grid size={{ xs: 12, sm: 4 }}>
                <Total label="Received" minor={data.totals.paidMinor} currency={data.currency} />
              </Grid>
              <Grid size={{ xs: 12, sm: 4 }}>
                <Total label="Refunded" minor={data.totals.refundedMinor} currency={data.currency} refund />
              </Grid>
              <Grid size={{ xs: 12, sm: 4 }}>
                <Total label="Net" minor={data.totals.netMinor} currency={data.currency} />
              </Grid>
            </Grid>
            <DayTotals days={data.days} currency={data.currency} />
            <section aria-labelledby="list-title">
              <Typography id="list-title" variant="h3" component="h2" sx={{ fontSize: '1.05rem', mb: 1 }}>
                Each payment
              </Typography>
              <Typography variant="body2" color="text.secondary" sx={{ mb: 1, display: { sm: 'none' } }}>
                Tap a payment for its receipt, its refunds and Refund….
              </Typography>
              <PaymentsGrid data={data} zone={zone} onDetails={setDetails} onRefund={setRefunding} />
            </section>
          </>
        )}
      </Stack>
      {details && (
        <PaymentDetailsDialog
          row={rowById(details.id) ?? details}
          zone={zone}
          onClose={() => setDetails(null)}
          onRefund={() => {
            setRefunding(rowById(details.id) ?? details);
            setDetails(null);
          }}
        />
      )}
      {refunding && (
        <RefundDialog
          row={rowById(refunding.id) ?? refunding}
          onClose={() => setRefunding(null)}
          onRefunded={(row, amount) => {
            setRefunding(null);
            setDone(`Refunded ${formatMoney(amount, row.currency)} to ${row.rider.name}.`);
          }}
        />
      )}
      <Snackbar
        open={!!done}
        autoHideDuration={8000}
        onClose={() => setDone(null)}
        message={done}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      />
    </WorkshopShell>
  );
}

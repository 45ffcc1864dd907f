import CheckIcon from '@mui/icons-material/Check';
import CloseIcon from '@mui/icons-material/Close';
import EventRepeatIcon from '@mui/icons-material/EventRepeat';
import OpenInNewIcon from '@mui/icons-material/OpenInNew';
import SearchIcon from '@mui/icons-material/Search';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import InputAdornment from '@mui/material/InputAdornment';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import type { GridColDef } from '@mui/x-data-grid/models';
import type { AppointmentState, WorkshopAppointment } from '@loamline/shared-types';
import { useEffect, useMemo, useState } from 'react';
import { Link as RouterLink, useNavigate, useSearchParams } from 'react-router';
import { TextInput } from '@/components/ui/text-input';
import { GridAction, LazyDataGrid } from '@/components/ui/lazy-data-grid';
import { LoadError } from '@/components/ui/load-error';
import { pathTo } from '@/config/paths';
import { useWorkshopAppointments } from '../api/get-appointments';
import { useTeam } from '../api/get-team';
import { STATE_LABELS, staffActions } from '../utils/states';
import { localDate, localTime, dayLabel, zoneLabel } from '../utils/time';
import { ACTION_LABELS, useAppointmentActions } from './action-dialogs';
import { RequestsList } from './requests-list';
import { StateChip } from './state-chip';
import { WorkshopShell } from './workshop-shell';

/** The state filter: a few useful groups, then each state. */
const FILTERS: { value: string; label: string; states: AppointmentState[] }[] = [
  { value: 'answer', label: 'Needs an answer', states: ['requested'] },
  { value: 'open', label: 'Open (held, requested, confirmed)', states: ['held', 'requested', 'confirmed'] },
  { value: 'all', label: 'All states', states: [] },
  ...(Object.keys(STATE_LABELS) as AppointmentState[]).map((s) => ({
    value: s,
    label: STATE_LABELS[s],
    states: [s],
  })),
];

/** Waits until typing stops before the search goes to the server. */
function useDebounced<T>(value: T, ms = 300): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/** `/workshop/requests`: the shop's appointments in a dense table with the actions each state allows. */
export function RequestsPage() {
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const filter = FILTERS.find((f) => f.value === params.get('state')) ?? FILTERS[1];
  const [search, setSearch] = useState(params.get('q') ?? '');
  const q = useDebounced(search);
  const { data: team } = useTeam();
  const zone = team?.shop.timeZone;
  // while another filter or search loads, the rows shown so far stay (marked busy) instead of the page
  // collapsing to a loading line and growing back
  const { data, error, mutate, isLoading } = useWorkshopAppointments(
    { status: filter.states, q },
    { keepPreviousData: true },
  );
  const actions = useAppointmentActions();
  // a phone gets a list of cards (requests-list.tsx), a wider screen the table
  const theme = useTheme();
  const wide = useMediaQuery(theme.breakpoints.up('md'), { noSsr: true });

  useEffect(() => {
    setParams(
      (p) => {
        if (q) p.set('q', q);
        else p.delete('q');
        return p;
      },
      { replace: true },
    );
  }, [q, setParams]);

  const columns = useMemo<GridColDef<WorkshopAppointment>[]>(
    () => [
      {
        field: 'start',
        headerName: 'Time',
        width: 200,
        // sorts by the instant; shows the shop's wall clock from the string's own offset
        valueGetter: (_v, row) => new Date(row.start).getTime(),
        renderCell: ({ row }) => (
          <RouterLink to={pathTo.workshopAppointment(row.id)} style={{ color: 'inherit' }}>
            {dayLabel(localDate(row.start))}, {localTime(row.start)}–{localTime(row.end)}
          </RouterLink>
        ),
      },
      {
        field: 'service',
        headerName: 'Service',
        flex: 1,
        minWidth: 160,
        valueGetter: (_v, row) => row.service.name,
      },
      {
        field: 'rider',
        headerName: 'Rider',
        flex: 1,
        minWidth: 150,
        valueGetter: (_v, row) => row.rider.name,
        renderCell: ({ row }) => (
          <Box sx={{ lineHeight: 1.25, py: 0.5 }}>
            <div>{row.rider.name}</div>
            {row.rider.massKg !== null && (
              <Typography variant="caption" color="text.secondary">
                {Math.round(row.rider.massKg)} kg with gear
              </Typography>
            )}
          </Box>
        ),
      },
      {
        field: 'bike',
        headerName: 'Bike',
        flex: 1,
        minWidth: 140,
        valueGetter: (_v, row) => row.bike?.name ?? '—',
      },
      { field: 'bench', headerName: 'Bench', width: 70, type: 'number' },
      {
        field: 'status',
        headerName: 'State',
        width: 170,
        valueGetter: (_v, row) => STATE_LABELS[row.status],
        renderCell: ({ row }) => (
          <Box sx={{ py: 0.5 }}>
            <StateChip state={row.status} />
            {row.proposedStart && (
              <Typography variant="caption" color="text.secondary" sx={{ display: 'block' }}>
                proposed {dayLabel(localDate(row.proposedStart))} {localTime(row.proposedStart)}
              </Typography>
            )}
          </Box>
        ),
      },
      {
        field: 'actions',
        type: 'actions',
        headerName: 'Actions',
        width: 130,
        getActions: ({ row }) => {
          const allowed = staffActions(row);
          const label = `${row.rider.name}, ${dayLabel(localDate(row.start))} ${localTime(row.start)}`;
          const items = [];
          if (allowed.includes('confirm'))
            items.push(
              <GridAction
                key="confirm"
                icon={<CheckIcon />}
                label={`Confirm: ${label}`}
                disabled={actions.busy === `${row.id}:confirm`}
                onClick={() => void actions.run(row, 'confirm')}
              />,
            );
          if (allowed.includes('decline'))
            items.push(
              <GridAction
                key="decline"
                icon={<CloseIcon />}
                label={`Decline: ${label}`}
                onClick={() => void actions.run(row, 'decline')}
              />,
            );
          if (allowed.includes('propose'))
            items.push(
              <GridAction
                key="propose"
                icon={<EventRepeatIcon />}
                label={ACTION_LABELS.propose}
                showInMenu
                onClick={() => void actions.run(row, 'propose')}
              />,
            );
          items.push(
            <GridAction
              key="open"
              icon={<OpenInNewIcon />}
              label="Open appointment"
              showInMenu
              onClick={() => void navigate(pathTo.workshopAppointment(row.id))}
            />,
          );
          return items;
        },
      },
    ],
    [actions, navigate],
  );

  return (
    <WorkshopShell maxWidth="xl">
      <Stack
        direction={{ xs: 'column', md: 'row' }}
        spacing={1.5}
        sx={{ mb: 1.5, alignItems: { md: 'center' } }}
      >
        <Typography variant="h3" component="h2" sx={{ flexGrow: 1 }}>
          Requests
        </Typography>
        <TextField
          select
          size="small"
          label="State"
          value={filter.value}
          onChange={(e) =>
            setParams(
              (p) => {
                p.set('state', e.target.value);
                return p;
              },
              { replace: true },
            )
          }
          sx={{ width: { md: 300 } }}
        >
          {FILTERS.map((f) => (
            <MenuItem key={f.value} value={f.value}>
              {f.label}
            </MenuItem>
          ))}
        </TextField>
        <TextInput
          size="small"
          label="Search rider or bike"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          sx={{ width: { md: 280 } }}
          slotProps={{
            input: {
              startAdornment: (
                <InputAdornment position="start">
                  <SearchIcon fontSize="small" />
                </InputAdornment>
              ),
            },
          }}
        />
      </Stack>
      {/* the zone on a line of its own, so that nothing below moves when it arrives (layout shift) */}
      <Typography variant="body2" color="text.secondary" noWrap>
        Times in the shop’s zone{zone ? `: ${zoneLabel(zone)}` : ''}.
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        {wide
          ? 'Confirm or decline requests; the menu at the end of a row proposes another time or opens the appointment.'
          : 'Confirm or decline requests, or propose another time; the time opens the appointment.'}
      </Typography>
      {actions.error && (
        <Alert severity="warning" onClose={actions.clearError} sx={{ mb: 1 }}>
          {actions.error}
        </Alert>
      )}
      {error ? (
        <LoadError what="The appointments" error={error} onRetry={() => void mutate()} />
      ) : !wide ? (
        <RequestsList
          // a new filter or search starts again at the first 25
          key={`${filter.value}|${q}`}
          rows={data}
          loading={isLoading}
          actions={actions}
        />
      ) : (
        <Box sx={{ bgcolor: 'background.paper', borderRadius: 2.5 }}>
          <LazyDataGrid
            aria-label="Appointments"
            rows={data ?? []}
            columns={columns}
            loading={isLoading}
            density="compact"
            autoHeight
            disableRowSelectionOnClick
            disableColumnMenu
            // a fixed height that fits the two-line cells (rider and weight, state and proposal): 'auto'
            // rows are measured one by one after rendering, the main cost of the page's first draw (TBT)
            rowHeight={60}
            initialState={{
              sorting: { sortModel: [{ field: 'start', sort: 'asc' }] },
              pagination: { paginationModel: { pageSize: 25 } },
            }}
            pageSizeOptions={[25, 50, 100]}
            localeText={{ noRowsLabel: 'No appointments match.', actionsCellMore: 'More actions' }}
            sx={{
              border: 1,
              borderColor: 'divider',
              '& .MuiDataGrid-cell': { display: 'flex', alignItems: 'center', py: 0.5 },
              '& .MuiDataGrid-columnHeaderTitle': { fontWeight: 700 },
            }}
          />
        </Box>
      )}
      {actions.dialogs}
    </WorkshopShell>
  );
}

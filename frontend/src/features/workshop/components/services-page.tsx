import AddIcon from '@mui/icons-material/Add';
import DeleteOutlinedIcon from '@mui/icons-material/DeleteOutlined';
import EditOutlinedIcon from '@mui/icons-material/EditOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import Chip from '@mui/material/Chip';
import IconButton from '@mui/material/IconButton';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ShopService } from '@loamline/shared-types';
import { useState } from 'react';
import { LoadError } from '@/components/ui/load-error';
import { useSession } from '@/features/auth/api/get-me';
import { ConfirmDialog } from '@/features/garage/components/confirm-dialog';
import { deleteService, useServices } from '../api/services';
import { useShopSettings } from '../api/settings';
import { formatMoney } from '../utils/money';
import { ServiceDialog } from './service-dialog';
import { WorkshopShell } from './workshop-shell';

/** `/workshop/services`: what riders can book; owners add and change, technicians read. */
export function ServicesPage() {
  const { user } = useSession();
  const owner = user?.role === 'owner';
  const { data, error, mutate } = useServices();
  const { data: settings } = useShopSettings();
  const currency = settings?.currency;
  const [editing, setEditing] = useState<ShopService | 'new' | null>(null);
  const [removing, setRemoving] = useState<ShopService | null>(null);
  const sorted = data
    ? [...data].sort((a, b) => Number(b.active) - Number(a.active) || a.name.localeCompare(b.name))
    : [];
  return (
    <WorkshopShell>
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center', mb: 1.5 }}>
        <Typography variant="h3" component="h2" sx={{ flexGrow: 1 }}>
          Services
        </Typography>
        {owner && (
          <Button
            variant="contained"
            startIcon={<AddIcon />}
            onClick={() => setEditing('new')}
            disabled={!currency}
          >
            Add a service
          </Button>
        )}
      </Stack>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        {owner
          ? `Prices in ${currency ?? 'the shop currency'}. A change applies to new bookings; booked appointments keep their price.`
          : 'Only the shop owner changes services.'}
      </Typography>
      {error && <LoadError what="The services" error={error} onRetry={() => void mutate()} />}
      {!data && !error && <Skeleton variant="rounded" height={200} />}
      {data && data.length === 0 && (
        <Alert severity="info">No services yet. {owner ? 'Add one so riders can book.' : ''}</Alert>
      )}
      {data && data.length > 0 && currency && (
        <TableContainer component={Card}>
          <Table
            size="small"
            aria-label="Services"
            sx={{ '& th': { fontWeight: 700, whiteSpace: 'nowrap' } }}
          >
            <TableHead>
              <TableRow>
                <TableCell>Service</TableCell>
                <TableCell align="right">Duration</TableCell>
                <TableCell align="right">Buffer after</TableCell>
                <TableCell align="right">Price</TableCell>
                <TableCell align="right">Deposit</TableCell>
                <TableCell>Bookable</TableCell>
                {owner && <TableCell align="right">Actions</TableCell>}
              </TableRow>
            </TableHead>
            <TableBody>
              {sorted.map((s) => (
                <TableRow key={s.id} sx={{ opacity: s.active ? 1 : 0.75 }}>
                  <TableCell sx={{ maxWidth: 420 }}>
                    <Typography variant="body2" sx={{ fontWeight: 500 }}>
                      {s.name}
                    </Typography>
                    {s.description && (
                      <Typography variant="caption" color="text.secondary">
                        {s.description}
                      </Typography>
                    )}
                  </TableCell>
                  <TableCell align="right">{s.durationMinutes} min</TableCell>
                  <TableCell align="right">{s.bufferAfterMinutes} min</TableCell>
                  <TableCell align="right">{formatMoney(s.priceMinor, currency)}</TableCell>
                  <TableCell align="right">
                    {s.priceMinor === 0
                      ? '—'
                      : s.depositMinor === s.priceMinor
                        ? 'In full'
                        : s.depositMinor === 0
                          ? 'None'
                          : formatMoney(s.depositMinor, currency)}
                  </TableCell>
                  <TableCell>
                    {s.active ? (
                      <Chip size="small" color="primary" label="Active" />
                    ) : (
                      <Chip size="small" variant="outlined" label="Retired" />
                    )}
                  </TableCell>
                  {owner && (
                    <TableCell align="right" sx={{ whiteSpace: 'nowrap' }}>
                      <IconButton size="small" aria-label={`Change ${s.name}`} onClick={() => setEditing(s)}>
                        <EditOutlinedIcon fontSize="small" />
                      </IconButton>
                      <IconButton size="small" aria-label={`Remove ${s.name}`} onClick={() => setRemoving(s)}>
                        <DeleteOutlinedIcon fontSize="small" />
                      </IconButton>
                    </TableCell>
                  )}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableContainer>
      )}
      {editing && currency && (
        <ServiceDialog
          service={editing === 'new' ? null : editing}
          currency={currency}
          onClose={() => setEditing(null)}
        />
      )}
      <ConfirmDialog
        open={!!removing}
        title={`Remove “${removing?.name ?? ''}”?`}
        confirmLabel="Remove"
        onConfirm={async () => {
          if (removing) await deleteService(removing.id);
        }}
        onClose={() => setRemoving(null)}
      >
        Riders can no longer book it. A service that was ever booked is kept as retired, so past appointments
        keep its name.
      </ConfirmDialog>
    </WorkshopShell>
  );
}

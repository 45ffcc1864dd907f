import { LoadError } from '@/components/ui/load-error';
import AddIcon from '@mui/icons-material/Add';
import DeleteOutlineIcon from '@mui/icons-material/DeleteOutlined';
import EditOutlinedIcon from '@mui/icons-material/EditOutlined';
import TuneIcon from '@mui/icons-material/Tune';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardActions from '@mui/material/CardActions';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Grid from '@mui/material/Grid';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Bike } from '@loamline/shared-types';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { deleteBike } from '../api/delete-bike';
import { useBikes } from '../api/get-bikes';
import { describeFork, describeShock } from '../utils/describe-bike';
import { BikeDialog } from './bike-dialog';
import { ConfirmDialog } from './confirm-dialog';

function Spec({ label, children }: { label: string; children: string }) {
  return (
    <Box>
      <Typography variant="overline" color="text.secondary" sx={{ lineHeight: 1.6 }}>
        {label}
      </Typography>
      <Typography variant="body2">{children}</Typography>
    </Box>
  );
}

function BikeCard({ bike, onEdit, onDelete }: { bike: Bike; onEdit: () => void; onDelete: () => void }) {
  const [prefs] = useUnitPrefs();
  return (
    <Card
      component="article"
      aria-label={bike.name}
      sx={{ height: '100%', display: 'flex', flexDirection: 'column' }}
    >
      <CardContent sx={{ flexGrow: 1 }}>
        <Typography variant="h3" component="h2" gutterBottom>
          {bike.name}
        </Typography>
        <Stack spacing={1}>
          <Spec label="Fork">{bike.fork ? describeFork(bike.fork, prefs) : 'None (rigid)'}</Spec>
          <Spec label="Rear shock">{bike.shock ? describeShock(bike.shock, prefs) : 'None (hardtail)'}</Spec>
        </Stack>
      </CardContent>
      <CardActions disableSpacing sx={{ px: 2, pb: 2, flexWrap: 'wrap', gap: 1 }}>
        <Button
          variant="contained"
          startIcon={<TuneIcon />}
          sx={{ width: { xs: '100%', sm: 'auto' }, minHeight: 44 }}
          component={RouterLink}
          to={pathTo.baselineWithBike(bike.id)}
        >
          Get a baseline with this bike
        </Button>
        <Box sx={{ flexGrow: 1, display: { xs: 'none', sm: 'block' } }} />
        <Button startIcon={<EditOutlinedIcon />} onClick={onEdit} aria-label={`Edit ${bike.name}`}>
          Edit
        </Button>
        <Button
          color="error"
          startIcon={<DeleteOutlineIcon />}
          onClick={onDelete}
          aria-label={`Delete ${bike.name}`}
        >
          Delete
        </Button>
      </CardActions>
    </Card>
  );
}

/** `/garage`: the rider's bikes, added once and picked in the wizard's Bike step. */
export function GaragePage() {
  const { data: bikes, error, mutate } = useBikes();
  const [editing, setEditing] = useState<Bike | 'new' | null>(null);
  const [deleting, setDeleting] = useState<Bike | null>(null);

  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <Stack
        direction={{ xs: 'column', sm: 'row' }}
        spacing={2}
        sx={{ alignItems: { sm: 'flex-end' }, justifyContent: 'space-between', mb: 3 }}
      >
        <Box>
          <Typography variant="h1" sx={{ fontSize: { xs: '1.9rem', md: '2.25rem' } }}>
            My garage
          </Typography>
          <Typography color="text.secondary" sx={{ mt: 1 }}>
            Your bikes with their fork and shock. Pick one in the baseline wizard instead of typing it again.
          </Typography>
        </Box>
        <Button variant="contained" size="large" startIcon={<AddIcon />} onClick={() => setEditing('new')}>
          Add a bike
        </Button>
      </Stack>

      {error && <LoadError what="Your garage" error={error} onRetry={() => void mutate()} />}
      {!bikes && !error && (
        <Stack spacing={2}>
          <Skeleton variant="rounded" height={160} />
          <Skeleton variant="rounded" height={160} />
        </Stack>
      )}
      {bikes && bikes.length === 0 && (
        <Card sx={{ textAlign: 'center', py: 5, px: 2 }}>
          <Typography variant="h3" component="h2" gutterBottom>
            No bikes yet
          </Typography>
          <Typography color="text.secondary" sx={{ mb: 3, maxWidth: 420, mx: 'auto' }}>
            Add your bike once — travel, stanchions, stroke, spring — and the baseline wizard fills its Bike
            step for you.
          </Typography>
          <Button variant="contained" startIcon={<AddIcon />} onClick={() => setEditing('new')}>
            Add your first bike
          </Button>
        </Card>
      )}
      {bikes && bikes.length > 0 && (
        <Grid container spacing={2}>
          {bikes.map((bike) => (
            <Grid key={bike.id} size={{ xs: 12 }}>
              <BikeCard bike={bike} onEdit={() => setEditing(bike)} onDelete={() => setDeleting(bike)} />
            </Grid>
          ))}
        </Grid>
      )}

      {editing && (
        <BikeDialog open bike={editing === 'new' ? undefined : editing} onClose={() => setEditing(null)} />
      )}
      <ConfirmDialog
        open={!!deleting}
        title={`Delete ${deleting?.name ?? 'this bike'}?`}
        confirmLabel="Delete bike"
        onConfirm={() => deleteBike(deleting!.id)}
        onClose={() => setDeleting(null)}
      >
        The bike leaves your garage. Baseline sheets you saved with it stay as they are.
      </ConfirmDialog>
    </Container>
  );
}

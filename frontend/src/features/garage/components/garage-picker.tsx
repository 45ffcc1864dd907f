import GarageOutlinedIcon from '@mui/icons-material/GarageOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import MenuItem from '@mui/material/MenuItem';
import Snackbar from '@mui/material/Snackbar';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Bike } from '@loamline/shared-types';
import { useEffect, useRef, useState } from 'react';
import { Link as RouterLink, useSearchParams } from 'react-router';
import { paths } from '@/config/paths';
import { useSession } from '@/features/auth/api/get-me';
import { STEPS } from '@/features/baseline/form';
import { useBaselineWizard, type BaselineWizard } from '@/features/baseline/hooks/use-baseline-wizard';
import { getBike } from '../api/get-bike';
import { useBikes } from '../api/get-bikes';

/** The wizard's input with a garage bike's fork and shock; what the rider entered so far stays. */
function withBike(wizard: BaselineWizard, bike: Bike) {
  return { ...wizard.currentInput(), fork: bike.fork, shock: bike.shock };
}

/** At the top of the Bike step, signed in: fill the step from a bike in My garage. */
export function GaragePicker() {
  const { user } = useSession();
  const { data: bikes } = useBikes(!!user);
  const wizard = useBaselineWizard();
  const [params] = useSearchParams();
  // a bike that came with ?bike= (from the garage) shows as picked
  const [picked, setPicked] = useState(params.get('bike') ?? '');
  if (!user || !bikes) return null;
  if (bikes.length === 0) {
    return (
      <Typography variant="body2" color="text.secondary">
        Bikes you keep in{' '}
        <Link component={RouterLink} to={paths.garage}>
          My garage
        </Link>{' '}
        can be picked here instead of typed.
      </Typography>
    );
  }
  return (
    <Box
      sx={{ border: 1, borderColor: 'divider', borderRadius: 2.5, p: 2, bgcolor: 'background.paper' }}
      className="no-print"
    >
      <Stack direction="row" spacing={1} sx={{ alignItems: 'center', mb: 1.5 }}>
        <GarageOutlinedIcon color="primary" />
        <Typography sx={{ fontWeight: 500 }}>From my garage</Typography>
      </Stack>
      <TextField
        select
        size="small"
        label="Pick a bike"
        helperText="Fills in the fork and shock below; you can still change them."
        value={bikes.some((b) => b.id === picked) ? picked : ''}
        onChange={(e) => {
          const bike = bikes.find((b) => b.id === e.target.value);
          if (!bike) return;
          setPicked(bike.id);
          wizard.setFromInput(withBike(wizard, bike), { step: 'bike' });
        }}
      >
        {bikes.map((b) => (
          <MenuItem key={b.id} value={b.id}>
            {b.name}
          </MenuItem>
        ))}
      </TextField>
    </Box>
  );
}

/**
 * Put inside `<BaselineWizardProvider>`: `/baseline?bike=<id>` (from "Get a baseline with this
 * bike") fills the Bike step from that garage bike; the rider starts at the first step and is not moved
 * when the bike arrives. The parameter is dropped once applied.
 */
export function BikeFromQuery() {
  const [params, setParams] = useSearchParams();
  const bikeId = params.get('bike');
  const { user } = useSession();
  const wizard = useBaselineWizard();
  const wizardRef = useRef(wizard);
  wizardRef.current = wizard;
  const [filled, setFilled] = useState<string | null>(null);
  const [failed, setFailed] = useState(false);
  const done = useRef<string | null>(null);

  useEffect(() => {
    if (!bikeId || !user || done.current === bikeId) return;
    done.current = bikeId;
    getBike(bikeId)
      .then((bike) => {
        const w = wizardRef.current;
        // The bike may arrive after the rider has begun (a slow network): what they entered stays, and
        // so does their step, unless it is past the Bike step, which then shows what was filled.
        const past = STEPS.findIndex((s) => s.id === 'bike') < w.step;
        w.setFromInput(withBike(w, bike), { step: past ? 'bike' : w.stepId });
        setFilled(bike.name);
        // applied once: a reload keeps what the rider enters from here (the wizard's kept draft)
        setParams(
          (p) => {
            const rest = new URLSearchParams(p);
            rest.delete('bike');
            return rest;
          },
          { replace: true },
        );
      })
      .catch(() => setFailed(true));
  }, [bikeId, user, setParams]);

  return (
    <Snackbar
      open={!!filled || failed}
      autoHideDuration={6000}
      onClose={() => {
        setFilled(null);
        setFailed(false);
      }}
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
    >
      <Alert severity={failed ? 'warning' : 'success'} variant="filled" sx={{ width: '100%' }}>
        {failed
          ? 'That bike is not in your garage any more; enter the Bike step by hand.'
          : `The Bike step is filled from “${filled}”. Start with your weight.`}
      </Alert>
    </Snackbar>
  );
}

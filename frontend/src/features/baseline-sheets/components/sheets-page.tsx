import { LoadError } from '@/components/ui/load-error';
import AddIcon from '@mui/icons-material/Add';
import ChevronRightIcon from '@mui/icons-material/ChevronRight';
import WarningAmberIcon from '@mui/icons-material/WarningAmber';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import Chip from '@mui/material/Chip';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { BaselineSheetListItem, BaselineSheetPartSummary } from '@loamline/shared-types';
import { Link as RouterLink } from 'react-router';
import { paths, pathTo } from '@/config/paths';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { formatNumber, type UnitPrefs } from '@/lib/units';
import { useSheets } from '../api/get-sheets';
import { FEEL_LABELS, STYLE_LABELS, percent, pressure, savedOn } from '../utils/format';

/** "25 % sag · 82 psi" or "30 % sag · 450 lb/in coil" */
export function headline(part: BaselineSheetPartSummary, prefs: UnitPrefs): string {
  const spring =
    part.pressurePsi !== null
      ? pressure(part.pressurePsi, prefs)
      : part.coilLbPerIn !== null
        ? `${formatNumber(part.coilLbPerIn, 0)} lb/in coil`
        : '';
  return [`${percent(part.targetSagPct)} sag`, spring].filter(Boolean).join(' · ');
}

function SheetRow({ sheet }: { sheet: BaselineSheetListItem }) {
  const [prefs] = useUnitPrefs();
  const warnings = (sheet.fork?.warnings ?? 0) + (sheet.shock?.warnings ?? 0);
  return (
    <Card component="li" sx={{ listStyle: 'none' }}>
      <CardActionArea component={RouterLink} to={pathTo.sheet(sheet.id)} sx={{ p: 2 }}>
        <Stack direction="row" spacing={2} sx={{ alignItems: 'center' }}>
          <Box sx={{ flexGrow: 1, minWidth: 0 }}>
            <Typography variant="subtitle1" component="h2" sx={{ fontWeight: 500 }} noWrap>
              {sheet.name}
            </Typography>
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              {savedOn(sheet.createdAt)} · {formatNumber(sheet.massKg, 0)} kg · {STYLE_LABELS[sheet.style]},{' '}
              {FEEL_LABELS[sheet.feel].toLowerCase()}
            </Typography>
            <Stack direction={{ xs: 'column', sm: 'row' }} spacing={{ xs: 0.25, sm: 3 }}>
              {sheet.fork && (
                <Typography variant="body2">
                  <Box component="span" sx={{ color: 'text.secondary' }}>
                    Fork{' '}
                  </Box>
                  <strong>{headline(sheet.fork, prefs)}</strong>
                </Typography>
              )}
              {sheet.shock && (
                <Typography variant="body2">
                  <Box component="span" sx={{ color: 'text.secondary' }}>
                    Shock{' '}
                  </Box>
                  <strong>{headline(sheet.shock, prefs)}</strong>
                </Typography>
              )}
            </Stack>
            {warnings > 0 && (
              <Chip
                size="small"
                color="warning"
                variant="outlined"
                icon={<WarningAmberIcon />}
                label={warnings === 1 ? '1 warning' : `${warnings} warnings`}
                sx={{ mt: 1 }}
              />
            )}
          </Box>
          <ChevronRightIcon color="action" />
        </Stack>
      </CardActionArea>
    </Card>
  );
}

/** `/sheets`: every baseline the rider saved, newest first. */
export function SheetsPage() {
  const { data: sheets, error, mutate } = useSheets();
  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <Stack direction="row" sx={{ justifyContent: 'space-between', alignItems: 'center', gap: 2 }}>
        <Typography variant="h1" sx={{ fontSize: { xs: '1.9rem', md: '2.25rem' } }}>
          Baseline sheets
        </Typography>
        {sheets && sheets.length > 0 && (
          <Button
            variant="outlined"
            startIcon={<AddIcon />}
            component={RouterLink}
            to={paths.baseline}
            sx={{ flexShrink: 0, whiteSpace: 'nowrap' }}
          >
            New baseline
          </Button>
        )}
      </Stack>
      <Typography color="text.secondary" sx={{ mt: 1, mb: 3 }}>
        Each sheet keeps what you entered and the baseline exactly as Loamline worked it out that day.
      </Typography>
      {error && <LoadError what="Your sheets" error={error} onRetry={() => void mutate()} />}
      {!sheets && !error && (
        <Stack spacing={1.5}>
          <Skeleton variant="rounded" height={96} />
          <Skeleton variant="rounded" height={96} />
        </Stack>
      )}
      {sheets && sheets.length === 0 && (
        <Card sx={{ textAlign: 'center', py: 5, px: 2 }}>
          <Typography variant="h3" component="h2" gutterBottom>
            No sheets yet
          </Typography>
          <Typography color="text.secondary" sx={{ mb: 3, maxWidth: 420, mx: 'auto' }}>
            Work out a baseline, then choose “Save as baseline sheet” on its result to keep it here.
          </Typography>
          <Button variant="contained" component={RouterLink} to={paths.baseline}>
            Get a baseline
          </Button>
        </Card>
      )}
      {sheets && sheets.length > 0 && (
        <Stack component="ul" spacing={1.5} sx={{ p: 0, m: 0 }} aria-label="Baseline sheets">
          {sheets.map((s) => (
            <SheetRow key={s.id} sheet={s} />
          ))}
        </Stack>
      )}
    </Container>
  );
}

import ReportProblemIcon from '@mui/icons-material/ReportProblem';
import Box from '@mui/material/Box';
import ExpandMoreIcon from '@mui/icons-material/ExpandMore';
import Accordion from '@mui/material/Accordion';
import AccordionDetails from '@mui/material/AccordionDetails';
import AccordionSummary from '@mui/material/AccordionSummary';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Assumption, BaselineSheet } from '@loamline/shared-types';
import { HowItWorks } from '@/features/baseline/components/how-it-works';
import { InputSummaryList } from '@/features/baseline/components/input-summary';
import { PartResultCard } from '@/features/baseline/components/part-result';
import { riderText } from '@/features/baseline/components/plain-text';
import { formatNumber, formatQuantity, quantityOfApiUnit, type UnitPrefs } from '@/lib/units';

/** An assumption's value; lengths, weights, pressures, volumes, altitude and temperature in the rider's units. */
function assumptionValue(a: Assumption, prefs: UnitPrefs): string {
  if (typeof a.value !== 'number') return `${a.value}${a.unit ? ` ${a.unit}` : ''}`;
  const quantity = quantityOfApiUnit(a.unit);
  if (quantity) return formatQuantity(quantity, a.value, prefs);
  const n = formatNumber(a.value, Number.isInteger(a.value) ? 0 : Math.abs(a.value) < 10 ? 3 : 1);
  return `${n}${a.unit ? ` ${a.unit}` : ''}`;
}
import { ochre } from '@/theme/primitives';

/**
 * A stored baseline, read-only, with the wizard's own result cards (sag, pressure and range or
 * coil rate, the spring curve, warnings) and the class names its print stylesheet knows.
 */
export function SheetSummary({ sheet, prefs }: { sheet: BaselineSheet; prefs: UnitPrefs }) {
  const { input, result } = sheet;
  return (
    <Stack spacing={3} className="baseline-sheet">
      <Box
        className="sheet-inputs"
        sx={{ bgcolor: 'background.paper', border: 1, borderColor: 'divider', borderRadius: 2.5, p: 2 }}
      >
        <InputSummaryList input={input} units={prefs} />
      </Box>
      <Box
        className="sheet-parts"
        sx={{
          display: 'grid',
          gap: 3,
          gridTemplateColumns: { xs: '1fr', md: result.fork && result.shock ? '1fr 1fr' : '1fr' },
        }}
      >
        {result.fork && (
          <PartResultCard
            part="fork"
            result={result.fork}
            units={prefs}
            fittedSpacers={input.fork?.spacers}
          />
        )}
        {result.shock && (
          <PartResultCard
            part="shock"
            result={result.shock}
            units={prefs}
            fittedSpacers={input.shock?.spacers}
          />
        )}
      </Box>
      <Box
        component="section"
        aria-labelledby="sheet-cautions-title"
        className="sheet-cautions"
        sx={{
          border: 2,
          borderColor: ochre[500],
          bgcolor: '#FFF8EA',
          borderRadius: 2.5,
          p: { xs: 2, sm: 3 },
        }}
      >
        <Stack direction="row" spacing={1} sx={{ alignItems: 'center', mb: 1 }}>
          <ReportProblemIcon sx={{ color: ochre[700] }} />
          <Typography variant="h3" component="h2" id="sheet-cautions-title">
            Before you ride
          </Typography>
        </Stack>
        <Box component="ul" sx={{ m: 0, pl: 3, '& li': { mb: 0.75 } }}>
          {result.cautions.map((c) => (
            <li key={c}>
              <Typography variant="body2">{riderText(c)}</Typography>
            </li>
          ))}
        </Box>
      </Box>
      {result.assumptions.length > 0 && (
        <Accordion
          component="section"
          aria-labelledby="sheet-assumed-title"
          className="sheet-assumed"
          disableGutters
          variant="outlined"
          slotProps={{ heading: { component: 'h2' } }}
          sx={{ borderRadius: '10px !important', '&:before': { display: 'none' } }}
        >
          <AccordionSummary expandIcon={<ExpandMoreIcon />} aria-controls="sheet-assumed-content">
            <Typography variant="h3" component="span" id="sheet-assumed-title">
              How this was worked out
            </Typography>
          </AccordionSummary>
          <AccordionDetails id="sheet-assumed-content">
            <HowItWorks />
            <Typography variant="h4" component="h3" sx={{ fontSize: '1.05rem', fontWeight: 700, mt: 3 }}>
              What Loamline assumed
            </Typography>
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
              Defaults and estimates used where nothing was entered, as they were when the sheet was saved.
            </Typography>
            <Stack component="ul" spacing={1} sx={{ listStyle: 'none', m: 0, p: 0 }}>
              {result.assumptions.map((a) => (
                <Box
                  component="li"
                  key={a.key}
                  sx={{
                    borderBottom: 1,
                    borderColor: 'divider',
                    pb: 1,
                    display: 'flex',
                    gap: 2,
                    flexWrap: 'wrap',
                  }}
                >
                  <Typography variant="body2" sx={{ fontWeight: 500, flex: '1 1 12rem' }}>
                    {riderText(a.label)}
                  </Typography>
                  <Typography variant="body2" sx={{ whiteSpace: 'nowrap' }}>
                    {assumptionValue(a, prefs)}
                  </Typography>
                  <Typography variant="body2" color="text.secondary" sx={{ flex: '1 1 10rem' }}>
                    {riderText(a.source)}
                  </Typography>
                </Box>
              ))}
            </Stack>
          </AccordionDetails>
        </Accordion>
      )}
    </Stack>
  );
}

import PlaceOutlinedIcon from '@mui/icons-material/PlaceOutlined';
import ScheduleIcon from '@mui/icons-material/Schedule';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ShopSummary } from '@loamline/shared-types';
import { zoneLabel } from '../utils/zoned-time';

/** The shop's name, town and the zone its times are in. */
export function ShopHeader({ shop, level = 1 }: { shop: ShopSummary; level?: 1 | 2 }) {
  return (
    <Stack spacing={0.75}>
      <Typography
        variant={level === 1 ? 'h1' : 'h2'}
        sx={{ fontSize: level === 1 ? { xs: '1.9rem', md: '2.25rem' } : '1.4rem' }}
      >
        {shop.name}
      </Typography>
      <Stack direction="row" spacing={1} sx={{ alignItems: 'center', color: 'text.secondary' }}>
        <PlaceOutlinedIcon fontSize="small" aria-hidden />
        <Typography>{shop.town}</Typography>
      </Stack>
      <Stack direction="row" spacing={1} sx={{ alignItems: 'center', color: 'text.secondary' }}>
        <ScheduleIcon fontSize="small" aria-hidden />
        <Typography>
          Times in {zoneLabel(shop.timeZone)} · {shop.timeZone}
        </Typography>
      </Stack>
    </Stack>
  );
}

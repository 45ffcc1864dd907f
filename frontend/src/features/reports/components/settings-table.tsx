import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { PartSettings } from '@loamline/shared-types';
import type { UnitPrefs } from '@/lib/units';
import { formatLength, formatPressure, formatRate } from '../utils/settings-units';
import { compactCells } from './table-styles';

type Row = { key: keyof PartSettings; label: string; show: (v: number) => string };

const ROWS = (prefs: UnitPrefs): Row[] => [
  { key: 'mainPsi', label: 'Main chamber', show: (v) => formatPressure(v, prefs) },
  { key: 'endStrokePsi', label: 'End-stroke chamber', show: (v) => formatPressure(v, prefs) },
  { key: 'spacers', label: 'Volume spacers', show: (v) => String(v) },
  { key: 'springRateLbPerIn', label: 'Spring rate', show: (v) => formatRate(v, prefs) },
  { key: 'reboundClicks', label: 'Rebound', show: (v) => `${v} click${v === 1 ? '' : 's'} from closed` },
  {
    key: 'compressionClicks',
    label: 'Compression',
    show: (v) => `${v} click${v === 1 ? '' : 's'} from closed`,
  },
  { key: 'sagMm', label: 'Sag measured', show: (v) => formatLength(v, prefs) },
];

/** What the shop set, fork and shock side by side; a setting neither part has is left out. */
export function SettingsTable({
  fork,
  shock,
  prefs,
}: {
  fork: PartSettings | null;
  shock: PartSettings | null;
  prefs: UnitPrefs;
}) {
  const rows = ROWS(prefs).filter(
    (r) => (fork?.[r.key] ?? null) !== null || (shock?.[r.key] ?? null) !== null,
  );
  if (!rows.length)
    return (
      <Typography variant="body2" color="text.secondary">
        The shop recorded no settings.
      </Typography>
    );
  const cell = (s: PartSettings | null, r: Row) => {
    const v = s?.[r.key] ?? null;
    return v === null ? '—' : r.show(v);
  };
  return (
    <Table size="small" aria-label="Settings the shop left" className="report-table" sx={compactCells}>
      <TableHead>
        <TableRow>
          <TableCell>Setting</TableCell>
          <TableCell>Fork</TableCell>
          <TableCell>Rear shock</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {rows.map((r) => (
          <TableRow key={r.key}>
            <TableCell component="th" scope="row">
              {r.label}
            </TableCell>
            <TableCell>{cell(fork, r)}</TableCell>
            <TableCell>{cell(shock, r)}</TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}

import UploadFileIcon from '@mui/icons-material/UploadFile';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormLabel from '@mui/material/FormLabel';
import InputAdornment from '@mui/material/InputAdornment';
import Radio from '@mui/material/Radio';
import RadioGroup from '@mui/material/RadioGroup';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useId, useRef, useState, type FormEvent } from 'react';
import { BASELINE_LIMITS } from '@loamline/shared-types';
import { TextInput } from '@/components/ui/text-input';
import { barToPsi, parseDecimal, round, type UnitPrefs } from '@/lib/units';
import { uploadAttachment } from '../api/workshop-report';
import type { Part } from '../types';
import { serverMessage } from '../utils/errors';
import { checkValue } from '../utils/report-form';
import { curveProblem, photoProblem, PHOTO_MAX_COUNT, PHOTO_TYPES } from '../utils/upload-limits';

/** A file picker behind a real button (keyboard and screen readers reach the button). */
function FilePick({
  label,
  accept,
  disabled,
  onFile,
  multiple,
}: {
  label: string;
  accept: string;
  disabled?: boolean;
  multiple?: boolean;
  onFile: (files: File[]) => void;
}) {
  const input = useRef<HTMLInputElement>(null);
  return (
    <>
      <Button
        variant="outlined"
        startIcon={<UploadFileIcon />}
        disabled={disabled}
        onClick={() => input.current?.click()}
      >
        {label}
      </Button>
      <input
        ref={input}
        type="file"
        hidden
        accept={accept}
        multiple={multiple}
        aria-label={label}
        data-testid={`${label}-input`}
        onChange={(e) => {
          const files = [...(e.target.files ?? [])];
          e.target.value = '';
          if (files.length) onFile(files);
        }}
      />
    </>
  );
}

/** Photos: JPEG, PNG or WebP, at most 8 MB each and 6 per appointment, one upload per file. */
export function PhotoUpload({ appointmentId, count }: { appointmentId: string; count: number }) {
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<string[]>([]);
  const upload = async (files: File[]) => {
    setBusy(true);
    const problems: string[] = [];
    let n = count;
    for (const f of files) {
      const p = photoProblem(f, n);
      if (p) {
        problems.push(p);
        continue;
      }
      try {
        await uploadAttachment(appointmentId, f);
        n += 1;
      } catch (e) {
        problems.push(`${f.name}: ${serverMessage(e)}`);
      }
    }
    setErrors(problems);
    setBusy(false);
  };
  const full = count >= PHOTO_MAX_COUNT;
  return (
    <Stack spacing={1}>
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center', flexWrap: 'wrap' }}>
        <FilePick
          label={busy ? 'Uploading…' : 'Add photos'}
          accept={PHOTO_TYPES.join(',')}
          multiple
          disabled={busy || full}
          onFile={(f) => void upload(f)}
        />
        <Typography variant="body2" color="text.secondary">
          JPEG, PNG or WebP, at most 8 MB each; {count} of {PHOTO_MAX_COUNT} photos used.
        </Typography>
      </Stack>
      {errors.length > 0 && (
        <Alert severity="error" role="alert" onClose={() => setErrors([])}>
          {errors.map((m) => (
            <div key={m}>{m}</div>
          ))}
        </Alert>
      )}
    </Stack>
  );
}

const EXAMPLE = [
  'travel_mm,force_N',
  '0.0,182',
  '5.0,231',
  '10.0,268',
  '…',
  '150.0,2140',
  '145.0,2010',
  '…',
  '0.0,120',
].join('\n');

/**
 * A bench run: its CSV with the settings it was run at. The server parses and checks every row and
 * answers the first problem with its line number; that message is shown as it is.
 */
export function CurveUpload({ appointmentId, prefs }: { appointmentId: string; prefs: UnitPrefs }) {
  const id = useId();
  const [label, setLabel] = useState('');
  const [part, setPart] = useState<Part>('fork');
  const [main, setMain] = useState('');
  const [endStroke, setEndStroke] = useState('');
  const [spacers, setSpacers] = useState('0');
  const [file, setFile] = useState<File | null>(null);
  const [tried, setTried] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const mainError =
    main.trim() === '' ? 'Enter the main pressure the run was made at' : checkValue('mainPsi', main, prefs);
  const endError = part === 'fork' ? checkValue('endStrokePsi', endStroke, prefs) : undefined;
  const spacerError =
    spacers.trim() === '' ? 'Enter the spacers fitted (0 for none)' : checkValue('spacers', spacers, prefs);
  const labelError = label.trim() === '' ? 'Name the run, e.g. “end-stroke 190 psi”' : undefined;
  const fileError = !file ? 'Choose the CSV file' : (curveProblem(file) ?? undefined);
  const invalid = !!(mainError || endError || spacerError || labelError || fileError);

  const psi = (text: string) => {
    const n = parseDecimal(text);
    return round(prefs.pressure === 'bar' ? barToPsi(n) : n, 1);
  };
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setTried(true);
    setDone(null);
    if (invalid || !file) return;
    setBusy(true);
    setError(null);
    try {
      await uploadAttachment(appointmentId, file, {
        label: label.trim(),
        part,
        mainPsi: psi(main),
        endStrokePsi: part === 'fork' && endStroke.trim() !== '' ? psi(endStroke) : null,
        spacers: Number(parseDecimal(spacers)),
      });
      setDone(`${label.trim()} added.`);
      setLabel('');
      setFile(null);
      setTried(false);
    } catch (err) {
      setError(serverMessage(err));
    } finally {
      setBusy(false);
    }
  };
  const show = (m: string | undefined) => (tried ? m : undefined);
  const unit = <InputAdornment position="end">{prefs.pressure}</InputAdornment>;
  return (
    <Box component="form" noValidate onSubmit={(e) => void submit(e)} aria-labelledby={`${id}-title`}>
      <Typography id={`${id}-title`} variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
        Add a measured curve
      </Typography>
      <Typography variant="body2" color="text.secondary" component="div" sx={{ mb: 1.5 }}>
        A CSV from the dyno, at most 1 MB. The first line names the two columns with their units —{' '}
        <code>travel_mm,force_N</code> or <code>travel_in,force_lbf</code> — then one row per reading: a full
        cycle, compression then rebound, in the order recorded. For example:
        <Box
          component="pre"
          sx={{
            bgcolor: 'background.paper',
            border: 1,
            borderColor: 'divider',
            borderRadius: 1,
            p: 1,
            my: 1,
            fontSize: '0.8rem',
            overflowX: 'auto',
          }}
        >
          {EXAMPLE}
        </Box>
      </Typography>
      <Stack spacing={1.5}>
        <TextInput
          size="small"
          label="Run label"
          value={label}
          onChange={(e) => setLabel(e.target.value)}
          error={!!show(labelError)}
          helperText={show(labelError) ?? 'Which run this is, e.g. “end-stroke 190 psi”'}
          slotProps={{ htmlInput: { maxLength: 80 } }}
        />
        <FormControl>
          <FormLabel id={`${id}-part`}>Part</FormLabel>
          <RadioGroup
            row
            aria-labelledby={`${id}-part`}
            value={part}
            onChange={(e) => setPart(e.target.value as Part)}
          >
            <FormControlLabel value="fork" control={<Radio />} label="Fork" />
            <FormControlLabel value="shock" control={<Radio />} label="Rear shock" />
          </RadioGroup>
        </FormControl>
        <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr 1fr' }, gap: 1.5 }}>
          <TextInput
            size="small"
            label="Main pressure"
            value={main}
            onChange={(e) => setMain(e.target.value)}
            error={!!show(mainError)}
            helperText={show(mainError) ?? ' '}
            slotProps={{
              htmlInput: { inputMode: 'decimal', 'aria-label': `Main pressure (${prefs.pressure})` },
              input: { endAdornment: unit },
            }}
          />
          {part === 'fork' && (
            <TextInput
              size="small"
              label="End-stroke pressure"
              value={endStroke}
              onChange={(e) => setEndStroke(e.target.value)}
              error={!!show(endError)}
              helperText={show(endError) ?? 'Blank without one'}
              slotProps={{
                htmlInput: { inputMode: 'decimal', 'aria-label': `End-stroke pressure (${prefs.pressure})` },
                input: { endAdornment: unit },
              }}
            />
          )}
          <TextInput
            size="small"
            label="Volume spacers"
            value={spacers}
            onChange={(e) => setSpacers(e.target.value)}
            error={!!show(spacerError)}
            helperText={show(spacerError) ?? ' '}
            slotProps={{
              htmlInput: {
                inputMode: 'numeric',
                min: BASELINE_LIMITS.spacers.min,
                max: BASELINE_LIMITS.spacers.max,
              },
            }}
          />
        </Box>
        <Stack direction="row" spacing={2} sx={{ alignItems: 'center', flexWrap: 'wrap' }}>
          <FilePick label="Choose CSV" accept=".csv,text/csv" onFile={([f]) => setFile(f)} />
          <Typography variant="body2" color={show(fileError) ? 'error' : 'text.secondary'}>
            {file ? file.name : (show(fileError) ?? 'No file chosen')}
            {file && show(fileError) ? ` — ${fileError}` : ''}
          </Typography>
        </Stack>
        {error && (
          <Alert severity="error" role="alert">
            The curve was not added: {error}
          </Alert>
        )}
        {done && (
          <Alert severity="success" role="status">
            {done}
          </Alert>
        )}
        <Box>
          <Button type="submit" variant="contained" disabled={busy}>
            {busy ? 'Uploading…' : 'Upload the curve'}
          </Button>
        </Box>
      </Stack>
    </Box>
  );
}

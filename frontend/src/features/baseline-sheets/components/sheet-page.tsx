import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import DeleteOutlinedIcon from '@mui/icons-material/DeleteOutlined';
import DriveFileRenameOutlineIcon from '@mui/icons-material/DriveFileRenameOutline';
import PrintOutlinedIcon from '@mui/icons-material/PrintOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Link as RouterLink, useNavigate, useParams } from 'react-router';
import { paths } from '@/config/paths';
import { BaselinePrintStyles } from '@/features/baseline/components/print-styles';
import { UnitsControl } from '@/features/baseline/components/units-control';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { ConfirmDialog } from '@/features/garage/components/confirm-dialog';
import { ApiRequestError } from '@/lib/api-client';
import { deleteSheet } from '../api/delete-sheet';
import { useSheet } from '../api/get-sheet';
import { renameSheet } from '../api/rename-sheet';
import { savedOn } from '../utils/format';
import { SheetNameDialog } from './rename-sheet-dialog';
import { SheetSummary } from './sheet-summary';

/** `/sheets/:id`: one saved baseline, read-only, with rename, delete and print. */
export function SheetPage() {
  const { id } = useParams();
  const navigate = useNavigate();
  const [prefs, setPrefs] = useUnitPrefs();
  const { data: sheet, error } = useSheet(id);
  const [renaming, setRenaming] = useState(false);
  const [deleting, setDeleting] = useState(false);

  const back = (
    <Button
      component={RouterLink}
      to={paths.sheets}
      startIcon={<ArrowBackIcon />}
      className="no-print"
      sx={{ mb: 2 }}
    >
      All sheets
    </Button>
  );

  if (error) {
    const missing = error instanceof ApiRequestError && error.status === 404;
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
        {back}
        <Alert severity={missing ? 'info' : 'error'}>
          {missing
            ? 'There is no baseline sheet here. It may have been deleted.'
            : `The sheet did not load: ${error.message}`}
        </Alert>
      </Container>
    );
  }
  if (!sheet) {
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
        {back}
        <Skeleton variant="text" width="60%" height={48} />
        <Skeleton variant="rounded" height={240} sx={{ mt: 2 }} />
      </Container>
    );
  }

  return (
    <Container maxWidth="lg" sx={{ py: { xs: 3, md: 5 } }}>
      <BaselinePrintStyles />
      <Stack
        direction="row"
        className="no-print"
        sx={{ justifyContent: 'space-between', alignItems: 'flex-start' }}
      >
        {back}
        <UnitsControl units={prefs} onChange={setPrefs} />
      </Stack>
      <Typography variant="overline" color="secondary.dark">
        Loamline baseline sheet · saved {savedOn(sheet.createdAt)}
      </Typography>
      <Typography variant="h1" sx={{ fontSize: { xs: '1.9rem', md: '2.25rem' }, overflowWrap: 'anywhere' }}>
        {sheet.name}
      </Typography>
      <Stack direction="row" className="no-print" sx={{ my: 2, flexWrap: 'wrap', gap: 1 }}>
        <Button
          variant="outlined"
          startIcon={<DriveFileRenameOutlineIcon />}
          onClick={() => setRenaming(true)}
        >
          Rename
        </Button>
        <Button variant="outlined" startIcon={<PrintOutlinedIcon />} onClick={() => window.print()}>
          Print
        </Button>
        <Button color="error" startIcon={<DeleteOutlinedIcon />} onClick={() => setDeleting(true)}>
          Delete
        </Button>
      </Stack>
      <SheetSummary sheet={sheet} prefs={prefs} />

      {renaming && (
        <SheetNameDialog
          open
          title="Rename sheet"
          initialName={sheet.name}
          submitLabel="Rename"
          onSubmit={async (name) => {
            await renameSheet(sheet.id, { name });
            setRenaming(false);
          }}
          onClose={() => setRenaming(false)}
        />
      )}
      <ConfirmDialog
        open={deleting}
        title={`Delete “${sheet.name}”?`}
        confirmLabel="Delete sheet"
        onConfirm={async () => {
          await deleteSheet(sheet.id);
          await navigate(paths.sheets, { replace: true });
        }}
        onClose={() => setDeleting(false)}
      >
        The sheet and the baseline on it are gone for good. You can always work out a new one.
      </ConfirmDialog>
    </Container>
  );
}

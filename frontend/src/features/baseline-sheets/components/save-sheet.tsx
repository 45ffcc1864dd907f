import BookmarkAddOutlinedIcon from '@mui/icons-material/BookmarkAddOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Snackbar from '@mui/material/Snackbar';
import type { BaselineInput, BaselineResult } from '@loamline/shared-types';
import { useEffect, useRef, useState } from 'react';
import { Link as RouterLink, useLocation, useNavigate, useSearchParams } from 'react-router';
import { paths, pathTo } from '@/config/paths';
import { useBaselineWizard } from '@/features/baseline/hooks/use-baseline-wizard';
import { useSession } from '@/features/auth/api/get-me';
import { formatQuantity, type UnitPrefs } from '@/lib/units';
import { createSheet } from '../api/create-sheet';
import { STYLE_LABELS, savedOn } from '../utils/format';
import { SheetNameDialog } from './rename-sheet-dialog';
import { RESUME_PARAM, RESUME_VALUE } from './resume-sheet-save';

/** "Enduro · 82 kg · 14 Mar 2026" */
export function defaultSheetName(input: BaselineInput, prefs: UnitPrefs, now = new Date()): string {
  return [
    STYLE_LABELS[input.riding.style],
    formatQuantity('mass', input.rider.massKg, prefs, 0),
    savedOn(now.toISOString()),
  ].join(' · ');
}

/**
 * "Save as baseline sheet" beside Print on the Baseline step. Signed out: keeps the input for this
 * tab and goes to sign-in, which comes back here. Signed in: asks a name, saves, links to the sheet.
 */
export function SaveSheetAction({ input }: { input: BaselineInput; result: BaselineResult }) {
  const { user, isLoading } = useSession();
  const { units } = useBaselineWizard();
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const location = useLocation();
  const [naming, setNaming] = useState(false);
  const [saved, setSaved] = useState<{ id: string; name: string } | null>(null);
  const [toast, setToast] = useState(false);
  const autoOpened = useRef(false);

  // A changed input is a new baseline: it can be saved again.
  useEffect(() => setSaved(null), [input]);

  // Back from sign-in: ask for the name straight away, once.
  useEffect(() => {
    if (autoOpened.current || isLoading || !user || params.get(RESUME_PARAM) !== RESUME_VALUE) return;
    autoOpened.current = true;
    setNaming(true);
    const rest = new URLSearchParams(params);
    rest.delete(RESUME_PARAM);
    // keep the entry's state: the wizard keeps its step there
    setParams(rest, { replace: true, state: location.state as unknown });
  }, [isLoading, user, params, setParams, location.state]);

  const onClick = () => {
    if (user) {
      setNaming(true);
      return;
    }
    // the wizard keeps its input and step for this tab (utils/draft.ts): sign-in comes back to them
    void navigate(pathTo.signIn(`${paths.baseline}?${RESUME_PARAM}=${RESUME_VALUE}`));
  };

  const openSheet = saved && (
    <Link component={RouterLink} to={pathTo.sheet(saved.id)} sx={{ fontWeight: 500 }}>
      Open the sheet
    </Link>
  );

  return (
    <>
      {!saved && (
        <Button
          variant="contained"
          size="large"
          startIcon={<BookmarkAddOutlinedIcon />}
          onClick={onClick}
          disabled={isLoading}
        >
          Save as baseline sheet
        </Button>
      )}
      {!user && !isLoading && (
        <Alert severity="info" variant="outlined" sx={{ alignSelf: { sm: 'center' }, py: 0 }}>
          Saving needs a free account: sign in or create one, and you come straight back here.
        </Alert>
      )}
      {saved && (
        <Alert severity="success" sx={{ alignSelf: { sm: 'center' } }}>
          Saved as “{saved.name}”. {openSheet}
        </Alert>
      )}
      {/* the page may be scrolled far from the button (the dialog opens by itself after sign-in) */}
      <Snackbar
        open={toast && !!saved}
        autoHideDuration={8000}
        onClose={(_e, reason) => reason !== 'clickaway' && setToast(false)}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      >
        <Alert severity="success" variant="filled" onClose={() => setToast(false)} sx={{ width: '100%' }}>
          Baseline sheet saved.{' '}
          {saved && (
            <Link component={RouterLink} to={pathTo.sheet(saved.id)} color="inherit" sx={{ fontWeight: 700 }}>
              Open it
            </Link>
          )}
        </Alert>
      </Snackbar>
      {naming && (
        <SheetNameDialog
          open
          title="Save as baseline sheet"
          initialName={defaultSheetName(input, units)}
          submitLabel="Save sheet"
          onSubmit={async (name) => {
            const sheet = await createSheet({ name, input });
            setSaved({ id: sheet.id, name: sheet.name });
            setToast(true);
            setNaming(false);
          }}
          onClose={() => setNaming(false)}
        />
      )}
    </>
  );
}

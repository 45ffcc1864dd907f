import ContentCopyIcon from '@mui/icons-material/ContentCopy';
import EventNoteOutlinedIcon from '@mui/icons-material/EventNoteOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { TextInput } from '@/components/ui/text-input';
import { ApiRequestError } from '@/lib/api-client';
import { renewCalendarFeed } from '../api/settings';

/** The owner's private calendar link: the schedule as a feed for a calendar app. */
export function CalendarFeedCard() {
  const [url, setUrl] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const make = async () => {
    setBusy(true);
    setError(null);
    setCopied(false);
    try {
      setUrl((await renewCalendarFeed()).url);
    } catch (e) {
      setError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
    } finally {
      setBusy(false);
    }
  };
  const copy = async () => {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
    } catch {
      setCopied(false);
      setError('The browser did not allow copying; select the link and copy it by hand.');
    }
  };
  return (
    <Card component="section" aria-labelledby="feed-title">
      <CardContent>
        <Stack direction="row" spacing={1.5} sx={{ alignItems: 'center', mb: 1 }}>
          <EventNoteOutlinedIcon color="primary" />
          <Typography id="feed-title" variant="h3" component="h2" sx={{ fontSize: '1.1rem' }}>
            Calendar link
          </Typography>
        </Stack>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
          A private address of the shop’s schedule for a calendar app (subscribe by URL). Anyone with the link
          can read the schedule, so keep it to the team. Making a new link ends the old one: calendars that
          use it stop updating.
        </Typography>
        {url && (
          <TextInput
            label="Your calendar link"
            value={url}
            size="small"
            fullWidth
            sx={{ mb: 1.5 }}
            slotProps={{
              htmlInput: {
                readOnly: true,
                onFocus: (e: React.FocusEvent<HTMLInputElement>) => e.target.select(),
              },
              input: {
                endAdornment: (
                  <InputAdornment position="end">
                    <IconButton aria-label="Copy the link" onClick={() => void copy()} edge="end">
                      <ContentCopyIcon fontSize="small" />
                    </IconButton>
                  </InputAdornment>
                ),
              },
            }}
            helperText={copied ? 'Copied.' : 'Shown once; make a new one if you lose it.'}
          />
        )}
        <Button variant="outlined" onClick={() => void make()} disabled={busy}>
          {busy ? 'Making…' : url ? 'Renew the link (ends this one)' : 'Make a calendar link'}
        </Button>
        {error && (
          <Alert severity="error" sx={{ mt: 1.5 }}>
            {error}
          </Alert>
        )}
      </CardContent>
    </Card>
  );
}

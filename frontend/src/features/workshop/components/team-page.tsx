import { LoadError } from '@/components/ui/load-error';
import Card from '@mui/material/Card';
import Chip from '@mui/material/Chip';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useSession } from '@/features/auth/api/get-me';
import { ROLE_LABELS } from '@/features/auth/types';
import { useTeam } from '../api/get-team';
import { InviteForm } from './invite-form';
import { WorkshopShell } from './workshop-shell';

const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const dateTime = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  hour: '2-digit',
  minute: '2-digit',
});

/** Dense rows: a narrow screen scrolls the table sideways instead of wrapping names and addresses. */
const NO_WRAP = { '& td, & th': { whiteSpace: 'nowrap' } } as const;

/** `/workshop/team`: who works at the shop, open invitations, and (owners) the invite form. */
export function TeamPage() {
  const { user } = useSession();
  const { data, error, mutate } = useTeam();
  return (
    <WorkshopShell>
      <Stack spacing={3}>
        {user?.role === 'owner' && <InviteForm />}
        {error && <LoadError what="The team" error={error} onRetry={() => void mutate()} />}
        {!data && !error && <Skeleton variant="rounded" height={200} />}
        {data && (
          <>
            <section aria-labelledby="staff-title">
              <Typography id="staff-title" variant="h3" component="h2" sx={{ mb: 1 }}>
                Staff ({data.members.length})
              </Typography>
              <TableContainer component={Card}>
                <Table size="small" aria-labelledby="staff-title" sx={NO_WRAP}>
                  <TableHead>
                    <TableRow>
                      <TableCell>Name</TableCell>
                      <TableCell>E-mail</TableCell>
                      <TableCell>Role</TableCell>
                      <TableCell>Since</TableCell>
                    </TableRow>
                  </TableHead>
                  <TableBody>
                    {data.members.map((m) => (
                      <TableRow key={m.id}>
                        <TableCell>
                          {m.name}
                          {m.id === user?.id && <Chip size="small" label="you" sx={{ ml: 1 }} />}
                        </TableCell>
                        <TableCell>{m.email}</TableCell>
                        <TableCell>{ROLE_LABELS[m.role]}</TableCell>
                        <TableCell>{day.format(new Date(m.createdAt))}</TableCell>
                      </TableRow>
                    ))}
                  </TableBody>
                </Table>
              </TableContainer>
            </section>
            <section aria-labelledby="invitations-title">
              <Typography id="invitations-title" variant="h3" component="h2" sx={{ mb: 1 }}>
                Open invitations ({data.invitations.length})
              </Typography>
              {data.invitations.length === 0 ? (
                <Typography variant="body2" color="text.secondary">
                  None waiting. Invitations that were used or expired are not shown.
                </Typography>
              ) : (
                <TableContainer component={Card}>
                  <Table size="small" aria-labelledby="invitations-title" sx={NO_WRAP}>
                    <TableHead>
                      <TableRow>
                        <TableCell>E-mail</TableCell>
                        <TableCell>Role</TableCell>
                        <TableCell>Sent by</TableCell>
                        <TableCell>Sent</TableCell>
                        <TableCell>Expires</TableCell>
                      </TableRow>
                    </TableHead>
                    <TableBody>
                      {data.invitations.map((i) => (
                        <TableRow key={i.id}>
                          <TableCell>{i.email}</TableCell>
                          <TableCell>{ROLE_LABELS[i.role]}</TableCell>
                          <TableCell>{i.invitedByName ?? '—'}</TableCell>
                          <TableCell>{dateTime.format(new Date(i.createdAt))}</TableCell>
                          <TableCell>{dateTime.format(new Date(i.expiresAt))}</TableCell>
                        </TableRow>
                      ))}
                    </TableBody>
                  </Table>
                </TableContainer>
              )}
            </section>
          </>
        )}
      </Stack>
    </WorkshopShell>
  );
}

import GroupsOutlinedIcon from '@mui/icons-material/GroupsOutlined';
import { LoadError } from '@/components/ui/load-error';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import CardContent from '@mui/material/CardContent';
import Grid from '@mui/material/Grid';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router';
import { paths } from '@/config/paths';
import { useSession } from '@/features/auth/api/get-me';
import { ROLE_LABELS } from '@/features/auth/types';
import { useTeam } from '../api/get-team';
import { WorkshopShell } from './workshop-shell';

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <Stack direction="row" spacing={2} sx={{ py: 0.5 }}>
      <Typography variant="body2" color="text.secondary" sx={{ width: 120, flexShrink: 0 }}>
        {label}
      </Typography>
      <Typography variant="body2">{value}</Typography>
    </Stack>
  );
}

/** `/workshop`: the shop at a glance, for its technicians and owners. */
export function WorkshopHomePage() {
  const { user } = useSession();
  const { data, error, mutate } = useTeam();
  const plural = (n: number, one: string, many: string) => `${n === 0 ? 'no' : n} ${n === 1 ? one : many}`;
  return (
    <WorkshopShell>
      {error && <LoadError what="The shop" error={error} onRetry={() => void mutate()} />}
      {data && (
        <Grid container spacing={2}>
          <Grid size={{ xs: 12, md: 6 }}>
            <Card sx={{ height: '100%' }}>
              <CardContent>
                <Typography variant="h3" component="h2" gutterBottom>
                  The shop
                </Typography>
                <Fact label="Name" value={data.shop.name} />
                <Fact label="Town" value={data.shop.town} />
                <Fact label="Time zone" value={data.shop.timeZone.replace(/_/g, ' ')} />
                <Fact label="Currency" value={data.shop.currency} />
                {user && <Fact label="Your role" value={ROLE_LABELS[user.role]} />}
              </CardContent>
            </Card>
          </Grid>
          <Grid size={{ xs: 12, md: 6 }}>
            <Card sx={{ height: '100%' }}>
              <CardActionArea component={RouterLink} to={paths.workshopTeam} sx={{ height: '100%' }}>
                <CardContent>
                  <Stack direction="row" spacing={1.5} sx={{ alignItems: 'center', mb: 1 }}>
                    <GroupsOutlinedIcon color="primary" />
                    <Typography variant="h3" component="h2">
                      Team
                    </Typography>
                  </Stack>
                  <Typography variant="body2" color="text.secondary">
                    {plural(data.members.length, 'person works', 'people work')} here ·{' '}
                    {plural(data.invitations.length, 'open invitation', 'open invitations')}.
                    {user?.role === 'owner' ? ' Invite technicians and owners by e-mail.' : ''}
                  </Typography>
                  <Typography variant="body2" color="primary" sx={{ mt: 1.5, fontWeight: 500 }}>
                    See the team →
                  </Typography>
                </CardContent>
              </CardActionArea>
            </Card>
          </Grid>
        </Grid>
      )}
    </WorkshopShell>
  );
}

import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Typography from '@mui/material/Typography';
import { Component, type ReactNode } from 'react';
import { Link as RouterLink } from 'react-router';
import { paths } from '@/config/paths';

export function RouteError({ error }: { error: unknown }) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Container maxWidth="sm" sx={{ py: 8 }}>
      <Typography variant="h2" gutterBottom>
        This page hit a rock
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        {message}
      </Typography>
      <Button variant="contained" component={RouterLink} to={paths.home}>
        Back to the start
      </Button>
    </Container>
  );
}

/** Catches what a page throws while drawing (react.dev, "Catching rendering errors with an error boundary"). */
export class RouteErrorBoundary extends Component<
  { children: ReactNode },
  { failed: boolean; error: unknown }
> {
  override state = { failed: false, error: undefined as unknown };

  static getDerivedStateFromError(error: unknown) {
    return { failed: true, error };
  }

  override render() {
    return this.state.failed ? <RouteError error={this.state.error} /> : this.props.children;
  }
}

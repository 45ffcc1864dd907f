import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';

/** The frame of every account page: one card, phone first, generous spacing. */
export function AuthCard({
  title,
  intro,
  children,
  footer,
}: {
  title: string;
  intro?: ReactNode;
  children: ReactNode;
  footer?: ReactNode;
}) {
  return (
    <Container maxWidth="xs" sx={{ py: { xs: 3, sm: 6 }, px: { xs: 2, sm: 3 } }}>
      <Card>
        <CardContent sx={{ p: { xs: 2.5, sm: 4 }, '&:last-child': { pb: { xs: 3, sm: 4 } } }}>
          <Typography variant="h2" component="h1" gutterBottom>
            {title}
          </Typography>
          {intro && (
            <Typography color="text.secondary" sx={{ mb: 3 }}>
              {intro}
            </Typography>
          )}
          {children}
        </CardContent>
      </Card>
      {footer && <Box sx={{ mt: 3, textAlign: 'center' }}>{footer}</Box>}
    </Container>
  );
}

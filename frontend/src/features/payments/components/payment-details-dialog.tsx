import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Link from '@mui/material/Link';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { WorkshopPaymentRow } from '@loamline/shared-types';
import { Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { formatSlot } from '@/features/booking/utils/zoned-time';
import { refundableMinor } from '../utils/payment-words';
import { PaymentReceipt } from './payment-receipt';

/** One payment of the owner's list: who, what, when, its receipt with every refund; Refund from here too. */
export function PaymentDetailsDialog({
  row,
  zone,
  onClose,
  onRefund,
}: {
  row: WorkshopPaymentRow;
  zone: string;
  onClose: () => void;
  onRefund: () => void;
}) {
  return (
    <Dialog open onClose={onClose} fullWidth maxWidth="sm" aria-labelledby="payment-title">
      <DialogTitle id="payment-title">
        {row.rider.name} · {row.serviceName}
      </DialogTitle>
      <DialogContent>
        <Stack spacing={2}>
          <Typography variant="body2">
            {formatSlot(row.start, null, zone)} ·{' '}
            <Link component={RouterLink} to={pathTo.workshopAppointment(row.appointmentId)}>
              Open the appointment
            </Link>
            <br />
            {row.rider.email} · payment service reference {row.intentId}
          </Typography>
          <PaymentReceipt
            payment={row}
            zone={zone}
            viewer="staff"
            appointmentStatus={row.appointmentStatus}
          />
        </Stack>
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        <Button onClick={onClose}>Close</Button>
        <Button variant="outlined" color="error" disabled={refundableMinor(row) <= 0} onClick={onRefund}>
          Refund…
        </Button>
      </DialogActions>
    </Dialog>
  );
}

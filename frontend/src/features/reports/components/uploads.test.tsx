import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { api } from '@/lib/api-client';
import { DEFAULT_UNITS } from '@/lib/units';
import { CurveUpload, PhotoUpload } from './uploads';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const UPLOAD = 'POST /workshop/appointments/a1/attachments';

describe('uploads', () => {
  it('shows the server’s message for a bad CSV as it is, with the line number', async () => {
    serve({
      [UPLOAD]: () => {
        throw apiError(400, 'line 14: force is not a number');
      },
    });
    await renderRoutes(
      [{ path: '/', element: <CurveUpload appointmentId="a1" prefs={DEFAULT_UNITS} /> }],
      '/',
    );
    const user = userEvent.setup();
    await user.type(await screen.findByRole('textbox', { name: 'Run label' }), 'End-stroke 190 psi');
    await user.type(screen.getByRole('textbox', { name: 'Main pressure (psi)' }), '85');
    await user.type(screen.getByRole('textbox', { name: 'End-stroke pressure (psi)' }), '190');
    const csv = new File(['travel_mm,force_N\n0,abc\n'], 'fork.csv', { type: 'text/csv' });
    await user.upload(screen.getByTestId('Choose CSV-input'), csv);
    expect(screen.getByText('fork.csv')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Upload the curve' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'The curve was not added: line 14: force is not a number',
    );
    // sent as multipart with the run's settings, in psi
    const [path, init] = vi.mocked(api).mock.calls.at(-1)!;
    expect(path).toBe('/workshop/appointments/a1/attachments');
    const form = (init as { form: FormData }).form;
    expect(form.get('kind')).toBe('curve');
    expect(form.get('part')).toBe('fork');
    expect(form.get('mainPsi')).toBe('85');
    expect(form.get('endStrokePsi')).toBe('190');
    expect(form.get('spacers')).toBe('0');
    expect((form.get('file') as File).name).toBe('fork.csv');
  });

  it('asks for the settings a curve was run at before sending it', async () => {
    const upload = vi.fn();
    serve({ [UPLOAD]: upload });
    await renderRoutes(
      [{ path: '/', element: <CurveUpload appointmentId="a1" prefs={DEFAULT_UNITS} /> }],
      '/',
    );
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Upload the curve' }));
    expect(screen.getByText('Enter the main pressure the run was made at')).toBeInTheDocument();
    expect(screen.getByText('Choose the CSV file')).toBeInTheDocument();
    expect(upload).not.toHaveBeenCalled();
  });

  it('states the photo limits and refuses a photo over 8 MB without sending it', async () => {
    const upload = vi.fn();
    serve({ [UPLOAD]: upload });
    await renderRoutes([{ path: '/', element: <PhotoUpload appointmentId="a1" count={2} /> }], '/');
    expect(
      await screen.findByText('JPEG, PNG or WebP, at most 8 MB each; 2 of 6 photos used.'),
    ).toBeInTheDocument();
    const big = new File([new Uint8Array(8 * 1024 * 1024 + 1)], 'big.jpg', { type: 'image/jpeg' });
    await userEvent.setup().upload(screen.getByTestId('Add photos-input'), big);
    expect(await screen.findByRole('alert')).toHaveTextContent('big.jpg is 8.0 MB: at most 8 MB per photo.');
    expect(upload).not.toHaveBeenCalled();
  });
});

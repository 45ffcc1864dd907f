import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type * as apiClient from '@/lib/api-client';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '../testing/render-routes';
import { ForgotPasswordPage } from './forgot-password-page';
import { JoinPage } from './join-page';
import { ResetPasswordPage } from './reset-password-page';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const routes = [
  { path: '/forgot-password', element: <ForgotPasswordPage /> },
  { path: '/reset-password', element: <ResetPasswordPage /> },
  { path: '/join', element: <JoinPage /> },
];

describe('password reset and joining a shop', () => {
  beforeEach(() => vi.clearAllMocks());

  it('asking for a link never says whether the address has an account', async () => {
    const ask = vi.fn(() => undefined);
    serve({ 'POST /auth/password-reset': ask });
    await renderRoutes(routes, '/forgot-password');
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('E-mail'), 'nobody@example.test');
    await user.click(screen.getByRole('button', { name: 'Send me a link' }));
    expect(await screen.findByText(/If an account exists for/)).toHaveTextContent(
      'If an account exists for nobody@example.test, we sent it a link',
    );
    expect(ask).toHaveBeenCalledWith({ email: 'nobody@example.test' });
  });

  it('sets a new password with the token from the link', async () => {
    const confirm = vi.fn(() => undefined);
    serve({ 'POST /auth/password-reset/confirm': confirm });
    await renderRoutes(routes, '/reset-password?token=tok-123');
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('New password'), 'a brand new passphrase');
    await user.type(screen.getByLabelText('New password again'), 'a brand new passphrase!');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('The two passwords differ.')).toBeInTheDocument();
    expect(confirm).not.toHaveBeenCalled();

    await user.type(screen.getByLabelText('New password'), '!');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByRole('heading', { name: 'Password changed' })).toBeInTheDocument();
    expect(confirm).toHaveBeenCalledWith({ token: 'tok-123', password: 'a brand new passphrase!' });
  });

  it('says a spent link is spent', async () => {
    serve({
      'POST /auth/password-reset/confirm': () => {
        throw apiError(400, 'This reset link is not valid any more.', { token: 'is used or expired' });
      },
    });
    await renderRoutes(routes, '/reset-password?token=used');
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('New password'), 'a brand new passphrase');
    await user.type(screen.getByLabelText('New password again'), 'a brand new passphrase');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(/expired or was used already/);
  });

  it('a link without its token asks for a new one', async () => {
    serve({});
    await renderRoutes(routes, '/reset-password');
    expect(screen.getByText(/missing the code from the e-mail/)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toHaveAttribute(
      'href',
      '/forgot-password',
    );
  });

  it('the join page shows the shop and the invited address', async () => {
    serve({
      'GET /invitations/inv-1': () => ({
        shopName: 'Kettle Ridge Suspension Lab',
        email: 'new@example.test',
        role: 'technician',
      }),
    });
    await renderRoutes(routes, '/join?token=inv-1');
    expect(
      await screen.findByRole('heading', { name: 'Join Kettle Ridge Suspension Lab' }),
    ).toBeInTheDocument();
    expect(screen.getByText(/invited as a technician/)).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveValue('new@example.test');
  });

  it('an unknown or used invitation says so', async () => {
    serve({});
    await renderRoutes(routes, '/join?token=nope');
    expect(await screen.findByText(/not valid any more/)).toBeInTheDocument();
  });
});

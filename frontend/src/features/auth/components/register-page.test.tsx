import { PASSWORD_MIN_LENGTH } from '@loamline/shared-types';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type * as apiClient from '@/lib/api-client';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, rider, serve, Where } from '../testing/render-routes';
import { RegisterPage } from './register-page';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const routes = [
  { path: '/register', element: <RegisterPage /> },
  { path: '*', element: <Where /> },
];

async function fill(values: { name?: string; email?: string; password?: string }) {
  const user = userEvent.setup();
  if (values.name) await user.type(screen.getByLabelText('Name'), values.name);
  if (values.email) await user.type(screen.getByLabelText('E-mail'), values.email);
  if (values.password) await user.type(screen.getByLabelText('Password'), values.password);
  await user.click(screen.getByRole('button', { name: 'Create account' }));
}

describe('RegisterPage', () => {
  beforeEach(() => vi.clearAllMocks());

  it('refuses a bad e-mail and a short password, and names what is missing', async () => {
    serve({});
    await renderRoutes(routes, '/register');
    // one character short of the server's minimum (shared-types PASSWORD_MIN_LENGTH)
    await fill({ email: 'ria@', password: 'x'.repeat(PASSWORD_MIN_LENGTH - 1) });
    expect(await screen.findByText('Enter your name.')).toBeInTheDocument();
    expect(screen.getByText('That does not look like an e-mail address.')).toBeInTheDocument();
    expect(screen.getByText(`Use at least ${PASSWORD_MIN_LENGTH} characters.`)).toBeInTheDocument();
    expect(screen.getByLabelText('Password')).toHaveAttribute('aria-invalid', 'true');
  });

  it("shows the server's 400 under the input it names", async () => {
    serve({
      'POST /auth/register': () => {
        throw apiError(400, 'email: must be an e-mail address', { email: 'must be an e-mail address' });
      },
    });
    await renderRoutes(routes, '/register');
    await fill({ name: 'Ria', email: 'ria@example.test', password: 'long enough passphrase' });
    expect(await screen.findByText('Must be an e-mail address.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('says when the e-mail already has an account (409)', async () => {
    serve({
      'POST /auth/register': () => {
        throw apiError(409, 'Email already registered');
      },
    });
    await renderRoutes(routes, '/register');
    await fill({ name: 'Ria', email: 'ria@example.test', password: 'long enough passphrase' });
    expect(await screen.findByRole('alert')).toHaveTextContent(/already an account with this e-mail/);
  });

  it('creates the account and carries on to ?next=', async () => {
    const register = vi.fn(() => ({ user: rider }));
    serve({ 'POST /auth/register': register });
    await renderRoutes(routes, '/register?next=%2Fgarage');
    await fill({ name: ' Ria Rider ', email: 'ria@example.test', password: 'long enough passphrase' });
    await waitFor(() => expect(screen.getByLabelText('location')).toHaveTextContent('/garage'));
    expect(register).toHaveBeenCalledWith({
      name: 'Ria Rider',
      email: 'ria@example.test',
      password: 'long enough passphrase',
    });
  });
});

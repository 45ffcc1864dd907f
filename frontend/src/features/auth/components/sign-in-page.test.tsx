import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type * as apiClient from '@/lib/api-client';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, rider, serve, signedOut, Where } from '../testing/render-routes';
import { SignInPage } from './sign-in-page';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const routes = [
  { path: '/sign-in', element: <SignInPage /> },
  { path: '*', element: <Where /> },
];

async function fill(email: string, password: string) {
  const user = userEvent.setup();
  if (email) await user.type(screen.getByLabelText('E-mail'), email);
  if (password) await user.type(screen.getByLabelText('Password'), password);
  await user.click(screen.getByRole('button', { name: 'Sign in' }));
}

describe('SignInPage', () => {
  beforeEach(() => vi.clearAllMocks());

  it('checks the e-mail and asks for a password before calling the server', async () => {
    serve({ 'GET /auth/me': signedOut });
    await renderRoutes(routes, '/sign-in');
    await fill('ria.example.test', '');
    expect(await screen.findByText('That does not look like an e-mail address.')).toBeInTheDocument();
    expect(screen.getByText('Enter your password.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    const { api } = await import('@/lib/api-client');
    expect(vi.mocked(api)).not.toHaveBeenCalledWith('/auth/sign-in', expect.anything());
  });

  it('says "e-mail or password is wrong" on a 401', async () => {
    serve({
      'GET /auth/me': signedOut,
      'POST /auth/sign-in': () => {
        throw apiError(401, 'Invalid credentials');
      },
    });
    await renderRoutes(routes, '/sign-in');
    await fill('ria@example.test', 'not the password');
    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong.');
  });

  it('asks to wait a minute on a 429', async () => {
    serve({
      'POST /auth/sign-in': () => {
        throw apiError(429, 'ThrottlerException: Too Many Requests');
      },
    });
    await renderRoutes(routes, '/sign-in');
    await fill('ria@example.test', 'whatever-it-is');
    expect(await screen.findByRole('alert')).toHaveTextContent(/too many tries — wait a minute/i);
  });

  it('signs in and goes back to the page in ?next=', async () => {
    const signIn = vi.fn(() => ({ user: rider, accessToken: 'jwt' }));
    serve({ 'POST /auth/sign-in': signIn });
    await renderRoutes(routes, '/sign-in?next=%2Fsheets%2Fabc%3Fprint%3D1');
    await fill(' ria@example.test ', 'correct horse battery');
    await waitFor(() => expect(screen.getByLabelText('location')).toHaveTextContent('/sheets/abc?print=1'));
    // the e-mail is sent trimmed
    expect(signIn).toHaveBeenCalledWith({ email: 'ria@example.test', password: 'correct horse battery' });
  });

  it('never follows a ?next= that leaves the app', async () => {
    serve({ 'POST /auth/sign-in': () => ({ user: rider, accessToken: 'jwt' }) });
    await renderRoutes(routes, '/sign-in?next=%2F%2Fevil.example%2Fphish');
    await fill('ria@example.test', 'correct horse battery');
    await waitFor(() => expect(screen.getByLabelText('location')).toHaveTextContent(/^\/$/));
  });
});

import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { SIGNED_OUT_EVENT, UNREACHABLE_EVENT } from '@/lib/api-client';
import { AppTheme } from '@/theme/app-theme';
import { UnreachableNotice } from './unreachable-notice';

/**
 * Issue 12, fault tests, the browser's side of a database outage: the API client turns a 503 (or
 * no answer) into UNREACHABLE_EVENT (lib/api-client.test.ts); this notice is what the rider sees —
 * "can't reach Loamline, still signed in, try again" — and a signed-out event does not show it.
 */
describe('UnreachableNotice', () => {
  it('says the server cannot be reached, that the rider is still signed in, and to try again', async () => {
    render(
      <AppTheme>
        <UnreachableNotice />
      </AppTheme>,
    );
    expect(screen.queryByRole('alert')).toBeNull();
    act(() => {
      window.dispatchEvent(new CustomEvent(UNREACHABLE_EVENT));
    });
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent("Can't reach Loamline just now");
    expect(alert).toHaveTextContent('You are still signed in');
    expect(alert).toHaveTextContent(/try again/i);
    // the rider can close it
    await userEvent.click(within(alert).getByRole('button', { name: /close/i }));
    await waitFor(() => expect(screen.queryByRole('alert')).toBeNull()); // after its exit transition
  });

  it('stays hidden for the end of a session (that is the signed-out notice)', () => {
    render(
      <AppTheme>
        <UnreachableNotice />
      </AppTheme>,
    );
    act(() => {
      window.dispatchEvent(new CustomEvent(SIGNED_OUT_EVENT));
    });
    expect(screen.queryByRole('alert')).toBeNull();
  });
});

import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { WorkshopAppointment } from '@loamline/shared-types';
import { MemoryRouter } from 'react-router';
import { describe, expect, it, vi } from 'vitest';
import type { useAppointmentActions } from './action-dialogs';
import { RequestsList } from './requests-list';

/** An appointment far ahead (so Propose is allowed), with only the fields the list reads. */
function appointment(i: number, status: WorkshopAppointment['status'] = 'requested'): WorkshopAppointment {
  const start = new Date(Date.UTC(2031, 0, 10 + i, 9, 0));
  return {
    id: `a${i}`,
    status,
    start: start.toISOString(),
    end: new Date(start.getTime() + 45 * 60_000).toISOString(),
    bench: 1,
    service: { name: 'Air spring setup' },
    rider: { name: `Rider ${i}`, massKg: 80 + i },
    bike: null,
    proposedStart: null,
  } as unknown as WorkshopAppointment;
}

function actions(): ReturnType<typeof useAppointmentActions> {
  return {
    run: vi.fn(() => Promise.resolve(true)),
    dialogs: null,
    error: null,
    clearError: vi.fn(),
    busy: null,
  };
}

function renderList(rows: WorkshopAppointment[] | undefined, a = actions(), loading = false) {
  render(
    <MemoryRouter>
      <RequestsList rows={rows} loading={loading} actions={a} />
    </MemoryRouter>,
  );
  return a;
}

describe('Requests on a phone (a list of cards)', () => {
  it('lists the soonest first, each time a link to the appointment', () => {
    renderList([appointment(3), appointment(1), appointment(2)]);
    const items = within(screen.getByRole('list', { name: 'Appointments' })).getAllByRole('listitem');
    expect(items.map((li) => within(li).getByRole('link').getAttribute('href'))).toEqual([
      '/workshop/appointments/a1',
      '/workshop/appointments/a2',
      '/workshop/appointments/a3',
    ]);
    expect(items[0]).toHaveTextContent('Rider 1 · 81 kg with gear');
  });

  it('offers the actions the state allows and runs them for that appointment', async () => {
    const rows = [appointment(1), appointment(2, 'confirmed')];
    const a = renderList(rows);
    const [requested, confirmed] = within(screen.getByRole('list')).getAllByRole('listitem');
    await userEvent.click(within(requested).getByRole('button', { name: /^Confirm: Rider 1/ }));
    expect(a.run).toHaveBeenCalledWith(rows[0], 'confirm');
    await userEvent.click(within(requested).getByRole('button', { name: /^Decline: Rider 1/ }));
    expect(a.run).toHaveBeenCalledWith(rows[0], 'decline');
    // a confirmed one is not confirmed again (what each state allows: utils/states.ts, as the table)
    expect(within(confirmed).queryByRole('button', { name: /^Confirm/ })).not.toBeInTheDocument();
  });

  it('says what Confirm did, in a status line that takes the focus', async () => {
    renderList([appointment(1)]);
    await userEvent.click(screen.getByRole('button', { name: /^Confirm: Rider 1/ }));
    const status = await screen.findByRole('status');
    expect(status).toHaveTextContent(/^Confirmed: Rider 1, /);
    expect(status).toHaveFocus();
  });

  it('shows 25 at a time and the rest on request', async () => {
    renderList(Array.from({ length: 30 }, (_, i) => appointment(i)));
    const list = screen.getByRole('list', { name: 'Appointments' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(25);
    await userEvent.click(screen.getByRole('button', { name: 'Show more (5 left)' }));
    expect(within(list).getAllByRole('listitem')).toHaveLength(30);
    // the focus goes to the first card that came, not to the top of the page
    expect(within(within(list).getAllByRole('listitem')[25]).getByRole('link')).toHaveFocus();
    expect(screen.queryByRole('button', { name: /Show more/ })).not.toBeInTheDocument();
  });

  it('says when nothing matches', () => {
    renderList([]);
    expect(screen.getByText('No appointments match.')).toBeInTheDocument();
  });

  it('shows a status while loading', () => {
    renderList(undefined, actions(), true);
    expect(screen.getByRole('status')).toHaveTextContent('Loading the appointments');
  });
});

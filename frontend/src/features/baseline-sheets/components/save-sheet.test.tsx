import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { BaselineInput, BaselineResult, BaselineSheet } from '@loamline/shared-types';
import type * as apiClient from '@/lib/api-client';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';
import { renderRoutes, rider, serve, signedOut, Where } from '@/features/auth/testing/render-routes';
import { DRAFT_KEY } from '@/features/baseline/utils/draft';
import { SaveSheetAction } from './save-sheet';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const input: BaselineInput = {
  rider: { massKg: 82 },
  riding: { style: 'enduro', feel: 'balanced' },
  fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1 },
  shock: null,
};
// Only the input matters to saving: the server computes the stored result itself.
const result = { fork: null, shock: null, cautions: [], assumptions: [] } as BaselineResult;

const routes = [
  {
    path: '/baseline',
    element: (
      <BaselineWizardProvider>
        <SaveSheetAction input={input} result={result} />
      </BaselineWizardProvider>
    ),
  },
  { path: '*', element: <Where /> },
];

describe('Save as baseline sheet', () => {
  beforeEach(() => {
    vi.clearAllMocks();
    window.sessionStorage.clear();
  });

  it('signed out: asks to sign in, coming back to the result; the wizard’s draft keeps the input', async () => {
    serve({ 'GET /auth/me': signedOut });
    const { router } = await renderRoutes(routes, '/baseline');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Save as baseline sheet' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent('/baseline?resume=sheet')}`);
    // the wizard keeps its input and step for this tab all along (no second copy for the round trip)
    expect(window.sessionStorage.getItem(DRAFT_KEY)).not.toBeNull();
  });

  it('signed in: asks a name, saves the input and links to the sheet', async () => {
    const create = vi.fn((body: unknown): BaselineSheet => ({
      id: 'sheet-9',
      ...(body as { name: string; input: BaselineInput }),
      result,
      createdAt: '2026-03-14T09:00:00.000Z',
      updatedAt: '2026-03-14T09:00:00.000Z',
    }));
    serve({ 'GET /auth/me': () => rider, 'POST /baseline-sheets': create, 'GET /baseline-sheets': () => [] });
    await renderRoutes(routes, '/baseline');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Save as baseline sheet' }));
    const name = await screen.findByLabelText('Sheet name');
    expect((name as HTMLInputElement).value).toMatch(/^Enduro · 82 kg · /);
    await user.clear(name);
    await user.click(screen.getByRole('button', { name: 'Save sheet' }));
    expect(await screen.findByText('Give the sheet a name.')).toBeInTheDocument();
    expect(create).not.toHaveBeenCalled();

    await user.type(name, 'Enduro, dry season');
    await user.click(screen.getByRole('button', { name: 'Save sheet' }));
    expect(await screen.findByText(/Saved as “Enduro, dry season”/)).toBeInTheDocument();
    expect(create).toHaveBeenCalledWith({ name: 'Enduro, dry season', input });
    expect(screen.getByRole('link', { name: 'Open the sheet' })).toHaveAttribute('href', '/sheets/sheet-9');
  });

  it('back from sign-in at ?resume=sheet, the name dialog opens by itself, once', async () => {
    serve({ 'GET /auth/me': () => rider });
    const { router } = await renderRoutes(routes, '/baseline?resume=sheet');
    expect(await screen.findByRole('dialog', { name: 'Save as baseline sheet' })).toBeInTheDocument();
    await waitFor(() => expect(router.state.location.search).toBe(''));
  });
});

import { render, screen } from '@testing-library/react';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import { AppTheme } from '@/theme/app-theme';
import { HomePage } from './home-page';

describe('HomePage', () => {
  it('says what Loamline does for riders and for shops and leads to the baseline', () => {
    render(
      <AppTheme>
        <MemoryRouter>
          <HomePage />
        </MemoryRouter>
      </AppTheme>,
    );
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent(/sag and air pressure/i);
    expect(screen.getByRole('heading', { name: 'For riders' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'For suspension shops' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Get my baseline' })).toHaveAttribute('href', '/baseline');
  });
});

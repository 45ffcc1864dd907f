import '@testing-library/jest-dom/vitest';
import { cleanup } from '@testing-library/react';
import { afterEach } from 'vitest';

afterEach(() => {
  cleanup();
  // each test is a new tab: the wizard's kept draft (sessionStorage) does not carry over
  window.sessionStorage.clear();
});

import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';

// findBy*/waitFor wait up to 10 s (default 1 s): lazy chunks and MUI render slowly on a busy machine
configure({ asyncUtilTimeout: 10_000 });

afterEach(() => {
  cleanup();
  // each test is a new tab: the wizard's kept draft (sessionStorage) does not carry over
  window.sessionStorage.clear();
});

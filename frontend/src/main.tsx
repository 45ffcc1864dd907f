import '@fontsource/roboto/latin-400.css';
import '@fontsource/roboto/latin-500.css';
import '@fontsource/roboto/latin-700.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { config as zodConfig } from 'zod/v4/core';
import { App } from './app/app';

// The server's Content-Security-Policy allows no eval (docs/security.md); without this zod would try
// `new Function` once to see whether it may compile its parsers, and the browser reports a violation.
zodConfig({ jitless: true });

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

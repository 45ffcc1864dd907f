import '@fontsource/roboto/latin-400.css';
import '@fontsource/roboto/latin-500.css';
import '@fontsource/roboto/latin-700.css';
import { StrictMode, startTransition } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/app';

const root = createRoot(document.getElementById('root')!);
// The first render as a transition: React renders in slices and yields to the browser between them,
// so the first screen's work does not hold the main thread in one long task (issue 12, TBT).
startTransition(() => {
  root.render(
    <StrictMode>
      <App />
    </StrictMode>,
  );
});

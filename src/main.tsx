import '@fontsource/lato/400.css';
import '@fontsource/lato/700.css';
import './styles.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/App';
import { applyTheme, initialTheme } from './lib/theme';

// Before the first paint, so a dark-theme visitor never sees a white flash.
applyTheme(initialTheme());

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

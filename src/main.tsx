import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@fontsource-variable/source-serif-4';
import '@fontsource-variable/public-sans';
import './styles/index.css';
import { applyTheme, readStoredDim, readStoredTheme } from '@/lib/theme';
import { App } from '@/app/app';

// Before the first paint, so a night session never flashes the paper-white day theme.
applyTheme(readStoredTheme(), readStoredDim());

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element.');

createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

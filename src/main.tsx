import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
// Work Sans ships with the app (no font from a CDN): the weights the screens use.
import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
import './styles/index.css';
import { App } from './app/app';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

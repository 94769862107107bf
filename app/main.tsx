import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { FileCheck } from '../src/ui/FileCheck.tsx';
import './styles.css';

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <header className="top">
      <h1>Hairline</h1>
      <span className="fc-dim">label map check</span>
    </header>
    <main>
      <FileCheck />
    </main>
  </StrictMode>,
);

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { appStart } from './boot.ts';
import { FileCheck } from '../src/ui/FileCheck.tsx';
import { StoreProvider } from '../src/ui/storeContext.tsx';
import { Workspace } from '../src/ui/Workspace.tsx';
import './styles.css';
import './workspace.css';

const root = createRoot(document.getElementById('root')!);

if (new URLSearchParams(location.search).has('check')) {
  root.render(
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
} else {
  const app = appStart();
  (window as unknown as { hairline?: typeof app }).hairline = app;
  root.render(
    <StrictMode>
      <StoreProvider store={app.store} viewPool={app.viewPool}>
        <Workspace viewPool={app.viewPool} />
      </StoreProvider>
    </StrictMode>,
  );
}

/** Renderer entry: find the host, open the project database, show the app. */
import { createRoot } from 'react-dom/client';
import { App } from './app/App.tsx';
import { getDb } from './db/database.ts';
import { getHost } from './host/index.ts';
import { AppContext } from './app/context.ts';
import { FootageCheckPage, isFootageCheck } from './player/FootageCheckPage.tsx';
import './styles.css';

const root = createRoot(document.getElementById('root')!);

async function boot() {
  try {
    const host = getHost();
    const info = await host.info();
    const db = getDb();
    await db.open();
    const services = { host, info, db };
    // The page `whistlemark export` drives headless: functions only, no screens.
    if (location.hash === '#cli-export') {
      const { installCliExport } = await import('./export-clips/cli-page.ts');
      installCliExport(db, host);
      root.render(<p>Whistlemark export (command line)</p>);
      return;
    }
    // A page of its own for checking a footage file frame by frame (tests, benchmarks).
    if (isFootageCheck(location.hash)) {
      root.render(
        <AppContext.Provider value={services}>
          <FootageCheckPage hash={location.hash} />
        </AppContext.Provider>,
      );
    } else root.render(<App services={services} />);
  } catch (e) {
    root.render(
      <div className="boot-error" role="alert">
        <h1>Whistlemark could not start</h1>
        <p>{(e as Error).message}</p>
        <p>Close the window and start the app again. If this keeps happening, the project database may be damaged.</p>
      </div>,
    );
  }
}
void boot();

import { Logo } from "./logo";

/** What every page shows while PostgreSQL cannot be reached: the app's own plain page, never an internal error. */
export const DATABASE_DOWN = "The database cannot be reached; the live view keeps running.";

export function DatabaseDown() {
  return (
    <main className="grid min-h-screen place-items-center px-4">
      <section role="alert" aria-labelledby="database-down" className="card w-full max-w-lg p-6">
        <div className="mb-4 text-lg">
          <Logo />
        </div>
        <h1 id="database-down" className="text-lg font-semibold">
          {DATABASE_DOWN}
        </h1>
        <p className="mt-2 text-sm text-slate-600 dark:text-slate-300">
          Pages need PostgreSQL to check who you are, so they wait until it answers again. The sidecar keeps
          taking samples and running the production filters meanwhile. Reload this page in a moment; if it
          persists, ask whoever runs Tapwright to start the database.
        </p>
      </section>
    </main>
  );
}

import { Link } from 'react-router';

/** Shown when the signed-in role may not use a page. Says so plainly and offers a way on. */
export function NotAvailable({ homePath, homeLabel }: { homePath?: string; homeLabel?: string }) {
  return (
    <div className="mx-auto max-w-xl py-10">
      <h1 className="text-2xl font-semibold tracking-tight text-ink">Not available for your role</h1>
      <p className="mt-2 text-[0.9375rem] text-slate">
        This page is not part of what your role can use in Reboundry. If you need it for your work, ask a fleet manager to
        change your role.
      </p>
      {homePath ? (
        <p className="mt-5">
          <Link to={homePath} className="link font-medium">
            {homeLabel ?? 'Go to your start page'}
          </Link>
        </p>
      ) : null}
    </div>
  );
}

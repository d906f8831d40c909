import { isRouteErrorResponse, Link, useRouteError } from "react-router";
import { errorMessage } from "~/auth/refusal";

/** The teacher pages (board, students, reports, studio settings) keep the navigation when something fails, and say where to go next. */
export function RouteErrorBoundary() {
  const error = useRouteError();
  const status = isRouteErrorResponse(error) ? error.status : 500;
  const message =
    errorMessage(error) ??
    (status === 404
      ? "There is nothing at this address."
      : "Nearnote could not show this page. Try again in a moment.");
  return (
    <section className="mx-auto max-w-xl py-10 text-center">
      <h1 className="text-2xl font-semibold">
        {status === 403 ? "Not yours to see" : status === 404 ? "Not found" : "Something went wrong"}
      </h1>
      <p className="mt-3 text-ink-soft">{message}</p>
      <p className="mt-6">
        <Link to="/board" className="text-tide-dark underline">
          Back to the progress board
        </Link>
      </p>
    </section>
  );
}

import {
  data,
  isRouteErrorResponse,
  Link,
  Links,
  Meta,
  Outlet,
  Scripts,
  ScrollRestoration,
  useRouteError,
  useRouteLoaderData,
} from "react-router";
import type { Route } from "./+types/root";
import { currentUser, sessionMiddleware, viewerOf } from "~/auth/access.server";
import { errorMessage, refusedViewer } from "~/auth/refusal";
import { FlashMessage } from "~/components/FlashMessage";
import { SiteNav, type NavUser } from "~/components/SiteNav";
import { readFlash } from "~/server/flash.server";
import { useNonce } from "~/utils/nonce";
import { securityHeadersMiddleware } from "~/server/securityHeaders.server";
import "./app.css";

// Headers and nonce first, then the signed-in person, read once for every loader and action.
export const middleware: Route.MiddlewareFunction[] = [securityHeadersMiddleware, sessionMiddleware];

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.svg", type: "image/svg+xml" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await currentUser({ request, context });
  const { flash, header } = await readFlash(request);
  const navUser: NavUser = user ? viewerOf(user) : null;
  return data({ user: navUser, flash }, header ? { headers: { "Set-Cookie": header } } : undefined);
}

export function Layout({ children }: { children: React.ReactNode }) {
  const root = useRouteLoaderData<typeof loader>("root");
  // A layout's middleware that turns a signed-in person away does so before the root loader
  // runs; its refusal names the person instead, so they still show as signed in.
  const refused = refusedViewer(useRouteError());
  const nonce = useNonce();
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-screen bg-paper text-ink antialiased">
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-card focus:p-2"
        >
          Skip to content
        </a>
        <SiteNav user={root?.user ?? refused} />
        <main id="main" className="mx-auto max-w-6xl px-4 py-8">
          {root?.flash ? (
            <div className="mb-6">
              <FlashMessage tone={root.flash.tone}>{root.flash.message}</FlashMessage>
            </div>
          ) : null}
          {children}
        </main>
        <footer className="no-print mx-auto max-w-6xl px-4 pb-8 text-xs text-ink-soft">
          Nearnote · practice feedback for keyboard harmony ·{" "}
          <Link to="/privacy" className="underline">
            Privacy
          </Link>
        </footer>
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let message = "Nearnote hit an unexpected problem. Your work is saved; try again in a moment.";
  let stack: string | undefined;
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) {
      title = "Page not found";
      message = "There is nothing at this address. It may have moved, or the link may be mistyped.";
    } else if (error.status === 403) {
      title = "Not yours to see";
      message = errorMessage(error) ?? "This page belongs to someone else.";
    } else {
      title = `${error.status} ${error.statusText}`;
      message = errorMessage(error) ?? message;
    }
  } else if (import.meta.env.DEV && error instanceof Error) {
    stack = error.stack;
  }
  return (
    <section className="mx-auto max-w-xl py-10 text-center">
      <h1 className="text-3xl font-semibold">{title}</h1>
      <p className="mt-3 text-ink-soft">{message}</p>
      <p className="mt-6">
        <Link to="/" className="text-tide-dark underline">
          Back to the start
        </Link>
      </p>
      {stack ? <pre className="mt-6 overflow-x-auto rounded bg-card p-4 text-left text-xs">{stack}</pre> : null}
    </section>
  );
}

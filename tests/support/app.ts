// The app's real request handler, in-process: React Router's `createRequestHandler`
// over a server build assembled from app/routes.ts and the route modules vitest has
// loaded, so a test's Request runs through every middleware (security headers, the
// session, the layouts' access rules), the loaders, the actions and the page render,
// exactly as behind `npm start`, without a build step or a socket.
import path from "node:path";
import {
  createRequestHandler,
  isRouteErrorResponse,
  matchRoutes,
  UNSAFE_decodeViaTurboStream,
  UNSAFE_withComponentProps,
  UNSAFE_withErrorBoundaryProps,
  UNSAFE_withHydrateFallbackProps,
  type ServerBuild,
  type useActionData,
  type useLoaderData,
} from "react-router";
import routeConfig from "~/routes";
import { resetEnvForTests } from "~/server/env.server";
import { mailSettled } from "~/mail/mail.server";
import reactRouterConfig from "../../react-router.config";

type RouteNode = {
  id?: string;
  path?: string;
  index?: boolean;
  caseSensitive?: boolean;
  file: string;
  children?: RouteNode[];
};
type RouteModule = Record<string, unknown>;
type ManifestRoute = ServerBuild["assets"]["routes"][string];

/** Route ids as React Router gives them: the file under app/ without its extension. */
const routeId = (node: RouteNode) => node.id ?? node.file.replace(/\.[jt]sx?$/, "");

function manifestEntry(
  id: string,
  parentId: string | undefined,
  node: Omit<RouteNode, "file">,
  module: RouteModule,
): ManifestRoute {
  return {
    id,
    parentId,
    path: node.path,
    index: node.index,
    caseSensitive: node.caseSensitive,
    hasAction: typeof module.action === "function",
    hasLoader: typeof module.loader === "function",
    hasClientAction: false,
    hasClientLoader: false,
    hasClientMiddleware: false,
    hasDefaultExport: module.default !== undefined,
    hasErrorBoundary: module.ErrorBoundary !== undefined,
    // The browser bundle is not built: pages render, their script addresses lead nowhere.
    module: `/test-assets/${id}.js`,
    imports: [],
    css: [],
  } as unknown as ManifestRoute;
}

/** What React Router's Vite plugin does to a route module: the page components get their props (loaderData…). */
function asBuilt(module: RouteModule): RouteModule {
  const built = { ...module };
  if (module.default) built.default = UNSAFE_withComponentProps(module.default as never);
  if (module.ErrorBoundary) built.ErrorBoundary = UNSAFE_withErrorBoundaryProps(module.ErrorBoundary as never);
  if (module.HydrateFallback) built.HydrateFallback = UNSAFE_withHydrateFallbackProps(module.HydrateFallback as never);
  return built;
}

async function assembleBuild(): Promise<ServerBuild> {
  // The background timers (digest, sweeps) stay off in tests.
  process.env.NEARNOTE_BACKGROUND = "off";
  resetEnvForTests();
  const [root, entryServer] = await Promise.all([import("~/root").then(asBuilt), import("~/entry.server")]);
  const routes: ServerBuild["routes"] = { root: { id: "root", path: "", module: root as never } };
  const manifest: Record<string, ManifestRoute> = { root: manifestEntry("root", undefined, { path: "" }, root) };
  async function add(nodes: RouteNode[], parentId: string) {
    for (const node of nodes) {
      const id = routeId(node);
      const module = asBuilt(await import(/* @vite-ignore */ path.resolve("app", node.file)));
      routes[id] = {
        id,
        parentId,
        path: node.path,
        index: node.index,
        caseSensitive: node.caseSensitive,
        module: module as never,
      };
      manifest[id] = manifestEntry(id, parentId, node, module);
      if (node.children) await add(node.children, id);
    }
  }
  await add(routeConfig as RouteNode[], "root");
  return {
    entry: { module: entryServer as never },
    routes,
    assets: {
      entry: { module: "/test-assets/entry.client.js", imports: [] },
      routes: manifest,
      url: "/test-assets/manifest.js",
      version: "test",
    } as ServerBuild["assets"],
    basename: "/",
    publicPath: "/",
    assetsBuildDirectory: "build/client",
    future: reactRouterConfig.future as ServerBuild["future"],
    ssr: true,
    isSpaMode: false,
    prerender: [],
    routeDiscovery: { mode: "lazy", manifestPath: "/__manifest" },
    allowedActionOrigins: false,
  };
}

let handler: ReturnType<typeof createRequestHandler> | undefined;

/** How a test sends a request: by default it waits for the mail the app sends after answering. */
export type SendOptions = { waitForMail?: boolean };

/** Sends a Request through the app, as the production server does; mail it sends after answering has gone too. */
export async function send(request: Request, { waitForMail = true }: SendOptions = {}): Promise<Response> {
  handler ??= createRequestHandler(await assembleBuild(), "production");
  const response = await handler(request);
  if (waitForMail) await mailSettled();
  return response;
}

/** What a route's loader sends, typed as its page reads it: `ask<LoaderData<typeof loader>>(…)`. */
export type LoaderData<Loader> = ReturnType<typeof useLoaderData<Loader>>;
/** What a route's action answers (its failures and successes), typed as its page reads it. */
export type ActionData<Action> = NonNullable<ReturnType<typeof useActionData<Action>>>;

/** What a page's loader or action answered, read the way the browser's router reads it. */
export type Answer<T = unknown> = {
  status: number;
  headers: Headers;
  /** A redirect's target (a page, or a resource route's Location header). */
  location: string | null;
  data: T;
};

const DATA_SUFFIX = ".data";

/**
 * Asks a page route for its data as the browser's router does (a single-fetch `.data`
 * request): GET answers what the route's loader returned, any other method what its
 * action returned, each with the status it was sent with; a refusal or failure thrown
 * as `data(body, { status })` answers its body. Resource routes (API, files) answer their
 * Response as is: JSON is parsed, text read, anything else left as bytes.
 */
export async function ask<T = unknown>(
  request: Request,
  { routeId, ...options }: SendOptions & { routeId?: string } = {},
): Promise<Answer<T>> {
  const url = new URL(request.url);
  const leaf = await leafRoute(url.pathname);
  if (!leaf.isPage) {
    const response = await send(request, options);
    const type = response.headers.get("content-type") ?? "";
    const data = type.includes("json")
      ? await response.json()
      : type.startsWith("text")
        ? await response.text()
        : new Uint8Array(await response.arrayBuffer());
    return {
      status: response.status,
      headers: response.headers,
      location: response.headers.get("location"),
      data: data as T,
    };
  }
  const dataUrl = new URL(url);
  // The browser router's address for a page's data (trailing-slash aware: "/" asks "/_.data").
  dataUrl.pathname = url.pathname.endsWith("/") ? `${url.pathname}_${DATA_SUFFIX}` : `${url.pathname}${DATA_SUFFIX}`;
  const isAction = request.method !== "GET" && request.method !== "HEAD";
  if (!isAction) {
    // Only the route asked about, not the layouts above it.
    dataUrl.searchParams.set("_routes", routeId ?? leaf.id);
  }
  const response = await send(new Request(dataUrl, request), options);
  // A redirect answered to the browser's router: 202 with the real status and target in headers.
  const redirectTo = response.headers.get("x-remix-redirect");
  if (redirectTo) {
    return {
      status: Number(response.headers.get("x-remix-status") ?? 302),
      headers: response.headers,
      location: redirectTo,
      data: undefined as T,
    };
  }
  if (!response.body)
    return { status: response.status, headers: response.headers, location: null, data: undefined as T };
  const decoded = (await UNSAFE_decodeViaTurboStream(response.body, globalThis)).value as Record<
    string | symbol,
    unknown
  >;
  // A loader's redirect comes under a symbol key, an action's as the answer itself.
  const redirect = (Object.getOwnPropertySymbols(decoded).map((s) => decoded[s])[0] ??
    (typeof decoded.redirect === "string" ? decoded : undefined)) as { redirect: string; status: number } | undefined;
  if (redirect)
    return { status: redirect.status, headers: response.headers, location: redirect.redirect, data: undefined as T };
  const answer = (isAction ? decoded : (Object.values(decoded)[0] ?? {})) as { data?: unknown; error?: unknown };
  const error = isRouteErrorResponse(answer.error) ? answer.error.data : answer.error;
  return {
    status: response.status,
    headers: response.headers,
    location: null,
    data: (error ?? answer.data) as T,
  };
}

type MatchableRoute = {
  id: string;
  path?: string;
  index?: boolean;
  caseSensitive?: boolean;
  children?: MatchableRoute[];
};
let table: MatchableRoute[] | undefined;

/** The route tree of app/routes.ts in the shape React Router's own matcher reads. */
function routeTable(): MatchableRoute[] {
  const convert = (nodes: RouteNode[]): MatchableRoute[] =>
    nodes.map((n) => ({
      id: routeId(n),
      path: n.path,
      index: n.index,
      caseSensitive: n.caseSensitive,
      children: n.children ? convert(n.children) : undefined,
    }));
  table ??= convert(routeConfig as RouteNode[]);
  return table;
}

/** The innermost route React Router picks for this path, and whether it renders a page. */
async function leafRoute(pathname: string) {
  const matches = matchRoutes(routeTable() as never[], pathname) as Array<{ route: MatchableRoute }> | null;
  const leaf = matches?.at(-1)?.route;
  if (!leaf) throw new Error(`No route for ${pathname}`);
  const file = findFile(routeConfig as RouteNode[], leaf.id);
  const module = (await import(/* @vite-ignore */ path.resolve("app", file))) as RouteModule;
  return { id: leaf.id, isPage: module.default !== undefined };
}

function findFile(nodes: RouteNode[], id: string): string {
  for (const n of nodes) {
    if (routeId(n) === id) return n.file;
    const inner = n.children ? findFile(n.children, id) : "";
    if (inner) return inner;
  }
  return "";
}

import { useEffect, useRef } from "react";
import { Form, NavLink, useLocation } from "react-router";
import type { MembershipRole } from "~/db/schema";

export type NavUser = { name: string; role: MembershipRole | null; studioName: string | null } | null;

type Item = { to: string; label: string };

/** Navigation differs for visitors, students and teachers (owners are teachers here). */
export function navItems(user: NavUser): Item[] {
  if (!user) return [{ to: "/", label: "About" }];
  if (user.role === "student") {
    return [
      { to: "/home", label: "Practice" },
      { to: "/exercises", label: "Exercises" },
      { to: "/takes/new", label: "Upload" },
      { to: "/settings", label: "Settings" },
    ];
  }
  if (user.role === null)
    return [
      { to: "/home", label: "Home" },
      { to: "/settings", label: "Settings" },
    ];
  return [
    { to: "/home", label: "Studio" },
    { to: "/exercises", label: "Exercises" },
    { to: "/review", label: "Review" },
    { to: "/board", label: "Board" },
    { to: "/students", label: "Students" },
    { to: "/settings", label: "Settings" },
  ];
}

function NavItems({ user, className, itemClass }: { user: NavUser; className: string; itemClass: string }) {
  return (
    <ul className={className}>
      {navItems(user).map((item) => (
        <li key={item.to}>
          <NavLink
            to={item.to}
            end
            className={({ isActive }) =>
              `${itemClass} ${isActive ? "font-semibold text-tide-dark underline underline-offset-4" : "text-ink-soft hover:text-ink"}`
            }
          >
            {item.label}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}

function Account({ user, className }: { user: NavUser; className: string }) {
  return user ? (
    <div className={className}>
      <span className="min-w-0 text-ink-soft">
        {user.name}
        {user.studioName ? ` · ${user.studioName}` : ""}
      </span>
      <Form method="post" action="/logout">
        <button type="submit" className="text-tide-dark underline-offset-4 hover:underline">
          Sign out
        </button>
      </Form>
    </div>
  ) : (
    <div className={className}>
      <NavLink to="/login" className="text-tide-dark hover:underline">
        Sign in
      </NavLink>
      <NavLink to="/signup" className="rounded-md bg-tide px-3 py-1.5 font-semibold text-white hover:bg-tide-dark">
        Start a studio
      </NavLink>
    </div>
  );
}

/**
 * The site's navigation: a row of links on wide screens; on a phone a compact "Menu" button
 * (a <details> disclosure: its <summary> is a button the browser reports as expanded or
 * collapsed, and it opens without JavaScript) that closes again after each navigation.
 */
export function SiteNav({ user }: { user: NavUser }) {
  const menu = useRef<HTMLDetailsElement>(null);
  const location = useLocation();
  // Close after a navigation, not when the page first hydrates: a menu opened while the
  // scripts were still loading stays open.
  const shownAt = useRef(`${location.pathname}${location.search}`);
  useEffect(() => {
    const here = `${location.pathname}${location.search}`;
    if (here === shownAt.current) return;
    shownAt.current = here;
    if (menu.current) menu.current.open = false;
  }, [location.pathname, location.search]);
  return (
    <nav aria-label="Main" className="no-print border-b border-line bg-card">
      <div className="mx-auto flex max-w-6xl items-center gap-x-6 gap-y-2 px-4 py-3 md:flex-wrap">
        <NavLink
          to={user ? "/home" : "/"}
          className="flex shrink-0 items-center gap-2 text-lg font-semibold text-tide-dark"
        >
          <img src="/favicon.svg" alt="" width={24} height={24} />
          Nearnote
        </NavLink>
        <NavItems user={user} className="hidden flex-1 flex-wrap gap-4 text-sm md:flex" itemClass="" />
        <Account user={user} className="hidden items-center gap-3 text-sm md:flex" />
        <details ref={menu} className="relative ml-auto md:hidden" data-testid="compact-menu">
          <summary className="flex cursor-pointer list-none items-center gap-2 rounded-md border border-line bg-white px-3 py-2 text-sm font-semibold text-ink [&::-webkit-details-marker]:hidden">
            <svg aria-hidden="true" viewBox="0 0 16 12" className="h-3 w-4">
              <path d="M0 1h16M0 6h16M0 11h16" stroke="currentColor" strokeWidth="2" />
            </svg>
            Menu
          </summary>
          <div className="absolute right-0 z-30 mt-2 flex w-64 max-w-[calc(100vw-2rem)] flex-col gap-3 rounded-lg border border-line bg-card p-4 shadow-lg">
            <NavItems
              user={user}
              className="flex flex-col gap-1 text-base"
              itemClass="block rounded px-2 py-2 hover:bg-paper"
            />
            <Account user={user} className="flex flex-col items-start gap-2 border-t border-line pt-3 text-sm" />
          </div>
        </details>
      </div>
    </nav>
  );
}

import { Form, NavLink } from "react-router";
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
  if (user.role === null) return [{ to: "/home", label: "Home" }, { to: "/settings", label: "Settings" }];
  return [
    { to: "/home", label: "Studio" },
    { to: "/exercises", label: "Exercises" },
    { to: "/review", label: "Review" },
    { to: "/board", label: "Board" },
    { to: "/students", label: "Students" },
    { to: "/settings", label: "Settings" },
  ];
}

export function SiteNav({ user }: { user: NavUser }) {
  return (
    <nav aria-label="Main" className="no-print border-b border-line bg-card">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <NavLink to={user ? "/home" : "/"} className="flex items-center gap-2 text-lg font-semibold text-tide-dark">
          <img src="/favicon.svg" alt="" width={24} height={24} />
          Nearnote
        </NavLink>
        <ul className="flex flex-1 flex-wrap gap-4 text-sm">
          {navItems(user).map((item) => (
            <li key={item.to}>
              <NavLink
                to={item.to}
                end
                className={({ isActive }) =>
                  isActive ? "font-semibold text-tide-dark underline underline-offset-4" : "text-ink-soft hover:text-ink"
                }
              >
                {item.label}
              </NavLink>
            </li>
          ))}
        </ul>
        {user ? (
          <div className="flex items-center gap-3 text-sm">
            <span className="text-ink-soft">
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
          <div className="flex items-center gap-4 text-sm">
            <NavLink to="/login" className="text-tide-dark hover:underline">
              Sign in
            </NavLink>
            <NavLink to="/signup" className="rounded-md bg-tide px-3 py-1.5 font-semibold text-white hover:bg-tide-dark">
              Start a studio
            </NavLink>
          </div>
        )}
      </div>
    </nav>
  );
}

import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

// Routes are grouped by who may enter: each layout's middleware (app/auth/access.server.ts)
// turns away everyone else before any loader or action runs. Loaders and actions still call
// a `require*` helper for the rule about the one thing they serve (this take, this student…).
export default [
  // Anyone, signed in or not
  route("healthz", "routes/healthz.ts"),
  route("logout", "routes/logout.tsx"),
  route("verify", "routes/verify.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("reset-password", "routes/reset-password.tsx"),
  route("invite/:token", "routes/invite.$token.tsx"),
  route("switch-studio", "routes/switch-studio.ts"),
  route("privacy", "routes/privacy.tsx"),
  route("unsubscribe", "routes/unsubscribe.tsx"),
  route("dev/mail", "routes/dev.mail.tsx"),
  route("dev/mail/:id", "routes/dev.mail.$id.tsx"),

  // Visitors only: signed-in people are sent on to /home
  layout("routes/_visitors.ts", [
    index("routes/_index.tsx"),
    route("login", "routes/login.tsx"),
    route("signup", "routes/signup.tsx"),
  ]),

  // Signed in, any role: each page checks the one take or exercise it shows
  layout("routes/_signedIn.ts", [
    route("home", "routes/home.tsx"),
    route("settings", "routes/settings.tsx"),
    route("exercises", "routes/exercises.tsx"),
    route("exercises/:exerciseId", "routes/exercises.$exerciseId.tsx"),
    route("exercises/:exerciseId/edit", "routes/exercises.$exerciseId.edit.tsx"),
    route("takes/:takeId", "routes/takes.$takeId.tsx"),
    route("takes/:takeId/feedback", "routes/takes.$takeId.feedback.ts"),
  ]),

  // Students of the active studio: uploading takes
  layout("routes/_students.ts", [route("takes/new", "routes/takes.new.tsx")]),

  // Teachers of the active studio: students, progress board, reports, exercises, review queue
  layout("routes/_teachers.ts", [
    route("students", "routes/students.tsx"),
    route("board", "routes/board.tsx"),
    route("students/:studentId", "routes/students.$studentId.tsx"),
    route("reports/:studentId", "routes/reports.$studentId.tsx"),
    route("studio/settings", "routes/studio.settings.tsx"),
    route("exercises/new", "routes/exercises.new.tsx"),
    route("review", "routes/review.tsx"),
  ]),

  // JSON API: refusals answer 401 / 403 in JSON
  ...prefix("api", [
    layout("routes/_api.signedIn.ts", [
      route("me/export", "routes/api.me.export.ts"),
      route("takes", "routes/api.takes.ts"),
      route("takes/:takeId", "routes/api.takes.$takeId.ts"),
      route("takes/:takeId/file", "routes/api.takes.$takeId.file.ts"),
      route("takes/:takeId/window", "routes/api.takes.$takeId.window.ts"),
    ]),
    layout("routes/_api.teachers.ts", [
      route("students/:studentId/export", "routes/api.students.$studentId.export.ts"),
      route("progress", "routes/api.progress.ts"),
      route("export/progress.csv", "routes/api.export.progress[.]csv.ts"),
    ]),
  ]),

  route("*", "routes/$.tsx"),
] satisfies RouteConfig;

import { type RouteConfig, index, route } from "@react-router/dev/routes";

export default [
  index("routes/_index.tsx"),
  route("home", "routes/home.tsx"),
  route("logout", "routes/logout.tsx"),
  route("healthz", "routes/healthz.ts"),
  // Accounts: sign-in, invitations, settings, privacy (issue 4)
  route("login", "routes/login.tsx"),
  route("signup", "routes/signup.tsx"),
  route("verify", "routes/verify.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("reset-password", "routes/reset-password.tsx"),
  route("invite/:token", "routes/invite.$token.tsx"),
  route("students", "routes/students.tsx"),
  route("settings", "routes/settings.tsx"),
  route("switch-studio", "routes/switch-studio.ts"),
  route("privacy", "routes/privacy.tsx"),
  route("dev/mail", "routes/dev.mail.tsx"),
  route("dev/mail/:id", "routes/dev.mail.$id.tsx"),
  route("api/me/export", "routes/api.me.export.ts"),
  route("api/students/:studentId/export", "routes/api.students.$studentId.export.ts"),
  route("api/takes", "routes/api.takes.ts"),
  route("api/takes/:takeId", "routes/api.takes.$takeId.ts"),
  route("api/takes/:takeId/file", "routes/api.takes.$takeId.file.ts"),
  // Takes: upload and the take page (issue 5)
  route("takes/new", "routes/takes.new.tsx"),
  route("takes/:takeId", "routes/takes.$takeId.tsx"),
  // Progress board: compare students, reports, CSV export (issue 7)
  route("board", "routes/board.tsx"),
  route("students/:studentId", "routes/students.$studentId.tsx"),
  route("reports/:studentId", "routes/reports.$studentId.tsx"),
  route("studio/settings", "routes/studio.settings.tsx"),
  route("api/progress", "routes/api.progress.ts"),
  route("api/export/progress.csv", "routes/api.export.progress[.]csv.ts"),
  route("*", "routes/$.tsx"),
] satisfies RouteConfig;

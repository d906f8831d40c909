// Imported first by the server so React and React Router load their production builds.
process.env.NODE_ENV ??= "production";

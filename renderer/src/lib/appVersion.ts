// The version written into reports and project files: the desktop shell's own when present,
// else the package's (the browser build).
export const APP_VERSION: string =
  typeof window !== 'undefined' ? (window.plotrate?.appVersion ?? '0.1.0') : '0.1.0';

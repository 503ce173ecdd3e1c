/** The app's version string, fixed at build time. */
declare const __APP_VERSION__: string;

// The app version, kept in step with package.json (a test checks that they agree).
export const APP_VERSION = '0.1.0';

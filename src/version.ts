/** The package version, shown in reports and `exact-dw version`. Kept in step with package.json by a test. */
export const VERSION = '0.1.0';

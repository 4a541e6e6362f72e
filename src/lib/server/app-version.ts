import { version } from '../../../package.json';

/** The product version from package.json, reported by /api/health and in mail footers. */
export const APP_VERSION: string = version;

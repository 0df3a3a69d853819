export const APP_VERSION: string = require('../package.json').version;

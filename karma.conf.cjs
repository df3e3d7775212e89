// Karma configuration for `ng test` (the root package.json is an ES module, hence .cjs).
// Runs the specs once in the Debian Chromium, headless.
const fs = require('node:fs');
const path = require('node:path');

process.env.CHROME_BIN = '/usr/bin/chromium';

/** The global styles ask for the shipped fonts under /media/; serve them from node_modules. */
const fontFolders = [
  path.join(__dirname, 'node_modules/@fontsource/source-sans-3/files'),
  path.join(__dirname, 'node_modules/@material-symbols/font-400'),
];
function shippedFontsMiddleware() {
  return (req, res, next) => {
    const match = /^\/base\/media\/([\w.-]+\.woff2?)$/.exec((req.url || '').split('?')[0]);
    const file = match && fontFolders.map((dir) => path.join(dir, match[1])).find((f) => fs.existsSync(f));
    if (!file) return next();
    res.setHeader('Content-Type', file.endsWith('.woff2') ? 'font/woff2' : 'font/woff');
    fs.createReadStream(file).pipe(res);
  };
}

module.exports = function (config) {
  config.set({
    basePath: '',
    frameworks: ['jasmine'],
    plugins: [
      require('karma-jasmine'),
      require('karma-chrome-launcher'),
      { 'middleware:shipped-fonts': ['factory', shippedFontsMiddleware] },
    ],
    middleware: ['shipped-fonts'],
    client: {
      jasmine: {
        random: true,
      },
      clearContext: true,
    },
    reporters: ['progress'],
    browsers: ['ChromiumHeadlessCI'],
    customLaunchers: {
      ChromiumHeadlessCI: {
        base: 'ChromeHeadless',
        flags: [
          '--no-sandbox',
          '--headless',
          '--disable-gpu',
          '--disable-dev-shm-usage',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
          '--no-first-run',
          '--disable-quic',
        ],
      },
    },
    browserNoActivityTimeout: 60000,
    singleRun: true,
    autoWatch: false,
    restartOnFileChange: false,
  });
};

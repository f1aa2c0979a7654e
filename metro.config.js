// Learn more: https://docs.expo.dev/guides/customizing-metro/
const path = require('path');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);

/**
 * zod re-exports every translation of its error messages as `z.locales`. Metro does not
 * tree-shake, so all ~50 of them (about 270 KB, a seventh of the web bundle) would ship to
 * phones that only ever show our own English messages. Point that index at the English file,
 * which zod loads as its default anyway. Consequence: `z.locales.<lang>` is not available in
 * the app bundle (the server, run by Node, is unaffected).
 */
const ZOD_LOCALES_INDEX = path.join('zod', 'v4', 'locales', 'index.js');

config.resolver.resolveRequest = (context, moduleName, platform) => {
  const resolution = context.resolveRequest(context, moduleName, platform);
  if (resolution.type === 'sourceFile' && resolution.filePath.endsWith(ZOD_LOCALES_INDEX)) {
    return { type: 'sourceFile', filePath: path.join(path.dirname(resolution.filePath), 'en.js') };
  }
  return resolution;
};

module.exports = config;

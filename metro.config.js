// Metro as Expo sets it up, with one change: zod's index of ~40 locales is replaced by its
// English locale alone. zod/mini re-exports `locales` from its core, and Metro bundles every
// module a file names, so without this the web bundle carries ~270 KB of unused messages.
const path = require('node:path');

const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
const zodDir = `${path.sep}node_modules${path.sep}zod${path.sep}`;
const defaultResolve = config.resolver.resolveRequest;

config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (
    process.env.ZOD_ALL_LOCALES !== '1' &&
    context.originModulePath.includes(zodDir) &&
    /^\.\.\/locales\/index\.(c?js)$/.test(moduleName)
  ) {
    const ext = moduleName.endsWith('.cjs') ? 'cjs' : 'js';
    return {
      type: 'sourceFile',
      filePath: path.join(path.dirname(context.originModulePath), '..', 'locales', `en.${ext}`),
    };
  }
  return (defaultResolve ?? context.resolveRequest)(context, moduleName, platform);
};

module.exports = config;

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

// Inline requires on the web: a module's body runs when one of its imports is first used, not
// when the importing module runs, so the first screen does not run code only later screens
// (or later interactions) need. With tree shaking Expo's reconcile step keeps the requires of
// modules with side effects (per package.json "sideEffects") at the top, in order; the web
// first render measured the difference (README "Web bundle and first render").
// EXPO_INLINE_REQUIRES=0 turns it off to compare.
const defaultTransformOptions = config.transformer.getTransformOptions;
config.transformer.getTransformOptions = async (entryPoints, options, getDependencies) => {
  const base = await defaultTransformOptions(entryPoints, options, getDependencies);
  const inline = options.platform === 'web' && process.env.EXPO_INLINE_REQUIRES !== '0';
  return { ...base, transform: { ...base.transform, inlineRequires: inline } };
};

module.exports = config;

export { Flash } from './Flash';
export { LiveMark } from './LiveMark';
export { Notice } from './Notice';
export { Panel } from './Panel';
export { Splash } from './Splash';
export { useDocumentTitle } from './useDocumentTitle';
export { useNow } from './useNow';
export { useReducedMotion } from './useReducedMotion';

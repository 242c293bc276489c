export {
  BREAKPOINTS,
  CONTENT_MAX_WIDTH,
  FORM_MAX_WIDTH,
  LIST_COLUMN_WIDTH,
  SINGLE_COLUMN_MAX_WIDTH,
  getBreakpoints,
  useBreakpoints,
  type Breakpoints,
} from './breakpoints';
export { Columns } from './Columns';
export { Content } from './Content';
export { NotFoundScreen } from './NotFoundScreen';
export { Screen } from './Screen';
export { ScreenTitle } from './ScreenTitle';
export { ShopNav } from './ShopNav';
export { BackLink } from './BackLink';

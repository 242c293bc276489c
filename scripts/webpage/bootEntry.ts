// The boot script as the page runs it; finishExport.ts bundles this file with the export's own
// route chunk names in place of __ROUTE_CHUNKS__.
import { boot, type RouteChunks } from './boot';

declare const __ROUTE_CHUNKS__: RouteChunks;

boot(window, __ROUTE_CHUNKS__);

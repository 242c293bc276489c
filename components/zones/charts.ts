// The two charts behind one dynamic import (LazyCharts.tsx): Victory and d3 then live in one
// chunk of their own. Imported statically anywhere else, they would sit in two chunks, and
// Expo's splitter moves what two chunks share into __common.js, which every page loads.
export { HumidityChart } from './HumidityChart';
export { MarginChart } from './MarginChart';

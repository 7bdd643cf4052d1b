/**
 * User Timing names for the trace: a mark when its x scale changes (zoom, pan, reset) and a measure from that
 * mark to the first draw with the worker's new view. `npm run bench` reads the measures in headless Chromium.
 */
export const TRACE_ZOOM_MARK = 'crankprint-trace-zoom';
export const TRACE_REDRAW_MEASURE = 'crankprint-trace-redraw';

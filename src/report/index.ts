/** Reports: every analysis of one scenario collected, and rendered as one self-contained HTML file. */
export { collectReport, keyStationOf, passOptionsOf, REPORT_TILTS, type ReportData, type ReportOptions, type ReportTilt, type ReportDrawingPose } from './collect';
export { renderReportHtml, REPORT_CAUTIONS, COMMON_PRACTICE_MAX_SLOPE_DEG, COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG, type ReportMeta } from './html';
export { vehicleDrawing, type VehicleDrawingInput } from './drawing';
export { lineChart, polarChart, type Series, type ChartEvent, type PolarSeries } from './svg';
export { esc } from '../present/text';

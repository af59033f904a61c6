// Result exports: pure formatters (no DOM, no I/O) and the shared caution text.

// Types
export type { ApprovalState, ExportKFactors, ExportObservable, ExportProvenance, ExportSecondSet, LabelledBand, MatrixForExport, ResultForExport } from './types'
// Caution shown with every result
export { K_FACTOR_CAUTION, K_FACTOR_CAUTION_SHORT, RESULT_CAUTION, RESULT_CAUTION_SHORT, resultCaution, resultCautionShort } from './caution'
// Provenance
export { approvalText, confidenceText, kFactorText, provenanceLines, provenanceObject, secondSetText, setText } from './provenance'
// Number rounding for printed tables
export { decimalExponent, pdgErrorDecimals, roundDecimal, roundMeasurement, roundSignificant } from './numbers'
export type { RoundedMeasurement, RoundingOptions } from './numbers'
// CSV writer (RFC 4180, CRLF) used by every CSV Sheaf writes
export { CSV_EOL, csvLine, csvNumber, writeCsv } from './csv'
export type { CsvCell, CsvWriteOptions } from './csv'
// Formats
export { bandsToCsv, bandsToJson, bandsToJsonText, checkResult } from './bands'
export { bandsToLatex, latexMeasurement, latexNumber, latexTable, latexText } from './latex'
export type { LatexTableInput, LatexTableOptions } from './latex'
export { studyProvenanceLines, studyToCsv, studyToJson, studyToJsonText, studyToLatex } from './study'
export type { StudyForExport } from './study'
export { matrixToCsv } from './matrices'
// Figures (plain Plotly-shaped objects)
export { CORRELATION_SCALE, FIGURE_FONT, FIGURE_INK, FIGURE_PALETTE, axisTitle, bandFigure, correlationFigure, eigenvectorFigure, forwardImages, houseAxis, houseConfig, houseLayout, tryFigure, withAlpha } from './figures'
export type { AxisSpec, BandFigureInput, BinPositions, EigenvectorFigureInput, EigenvectorShift, EnvelopeBand, Figure, FigureImages, PlotTrace } from './figures'

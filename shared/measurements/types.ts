/** A problem in an uploaded measurement, located as precisely as the input allows. */
export interface LocatedIssue {
  message: string
  /** 1-based line of the file (or row of the JSON matrix). */
  line?: number
  /** 1-based column (field number). */
  column?: number
  /** Which file: the points or the correlation matrix. */
  file?: 'points' | 'correlation'
}

/** What is stored in measurements.data. */
export interface MeasurementData {
  values: number[]
  stat: number[] | null
  syst: number[] | null
  sources: Array<{ name: string, shifts: number[] }>
  correlation: number[][] | null
  correlationOf: 'syst' | 'total'
}

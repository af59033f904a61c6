/** A problem in an uploaded measurement, located as precisely as the input allows. */
export interface LocatedIssue {
  message: string
  /** 1-based line of the file (or row of the JSON matrix). */
  line?: number
  /** 1-based column (field number). */
  column?: number
  /** Which file: the points or the correlation matrix; or the form field. */
  file?: 'points' | 'correlation' | 'correlationOf' | 'systCombination'
}

/** Which errors a correlation matrix applies to. */
export type CorrelationOf = 'stat' | 'syst' | 'total'

/** How the syst column combines between points when no correlation matrix covers it. */
export type SystCombination = 'uncorrelated' | 'fully-correlated'

/** What is stored in measurements.data. */
export interface MeasurementData {
  values: number[]
  stat: number[] | null
  syst: number[] | null
  sources: Array<{ name: string, shifts: number[] }>
  correlation: number[][] | null
  /** Which errors `correlation` applies to (meaningless without a matrix). */
  correlationOf: CorrelationOf
  /** How syst combines between points when the matrix is not of syst; absent in rows stored before the choice existed: uncorrelated. */
  systCombination?: SystCombination
}

// Words for the uncertainty prescriptions, the same in the pages and in every export.
import type { Prescription } from '../physics/uncertainty/bands'

/** What a reader sees for each prescription. */
export const PRESCRIPTION_LABELS: Readonly<Record<Prescription, string>> = {
  'hessian-symmetric': 'Hessian pairs, symmetric',
  'hessian-asymmetric': 'Hessian pairs, asymmetric',
  'one-sided': 'Hessian one-sided eigenvectors',
  'replica-sd': 'Replicas, mean ± standard deviation',
  'replica-68-interval': 'Replicas, median and percentile interval'
}

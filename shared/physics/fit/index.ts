/**
 * Members from a fit: Hessian eigenvector pairs and Monte-Carlo replicas of a parameter vector
 * with its covariance, and the reproducible generator the replicas use.
 */

// Covariance checks
export { checkedCovariance, type CovarianceLike } from './covariance'

// Hessian eigenvector pairs
export { hessianMembers, type HessianMembers } from './hessian'

// Monte-Carlo replicas
export { replicaParameters } from './replicas'

// Reproducible random numbers
export { deterministicLog, philox4x32, standardNormals, uniformStream } from './prng'

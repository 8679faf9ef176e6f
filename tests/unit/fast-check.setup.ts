import fc from 'fast-check'

// Property tests run on a fixed seed so a CI run can be repeated exactly;
// FC_SEED=<n> explores other parameter sets. A failure is reported at once
// with its counterexample and seed instead of shrinking for minutes
// (FC_SHRINK=1 shrinks it, to study a failure locally).
fc.configureGlobal({
  seed: Number(process.env.FC_SEED ?? 20261201),
  endOnFailure: process.env.FC_SHRINK !== '1',
})

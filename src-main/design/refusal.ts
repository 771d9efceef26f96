// A design the tool will not make, with the reason a person can act on (a target outside what the
// model knows, an uncalibrated model, a model without a conserved energy). The CLI reports it as a
// data error (exit 1); it is not a programming error.
export class DesignRefusal extends Error {
  override name = 'DesignRefusal';
}

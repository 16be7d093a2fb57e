/** Accuracy settings of the solvers. Defaults are documented in DEVELOPERS.md. */
export interface Tolerances {
  /**
   * Relative tolerance of a time step's Newton update, against max(|x|, the unknown's running
   * peak): a tenth of the LTE tolerance, on the same scale. @defaultValue 1e-5
   */
  readonly newtonRelative: number;
  /** Relative tolerance of the bias point's last Newton update. @defaultValue 1e-9 */
  readonly biasRelative: number;
  /** Absolute tolerance of a Newton update on a voltage (V). @defaultValue 1e-9 */
  readonly newtonVoltage: number;
  /** Absolute tolerance of a Newton update on a current (A). @defaultValue 1e-12 */
  readonly newtonCurrent: number;
  /** Relative local-truncation-error tolerance, against each state's running peak. @defaultValue 1e-4 */
  readonly lteRelative: number;
  /** Absolute LTE tolerance on a voltage (V). @defaultValue 1e-6 */
  readonly lteVoltage: number;
  /** Absolute LTE tolerance on a current (A). @defaultValue 1e-9 */
  readonly lteCurrent: number;
  /** Newton iterations per transient step before the step is cut. @defaultValue 30 */
  readonly stepIterations: number;
  /** Newton iterations of one bias-point attempt. @defaultValue 150 */
  readonly biasIterations: number;
}

export const DEFAULT_TOLERANCES: Tolerances = {
  newtonRelative: 1e-5,
  biasRelative: 1e-9,
  newtonVoltage: 1e-9,
  newtonCurrent: 1e-12,
  lteRelative: 1e-4,
  lteVoltage: 1e-6,
  lteCurrent: 1e-9,
  stepIterations: 30,
  biasIterations: 150,
};

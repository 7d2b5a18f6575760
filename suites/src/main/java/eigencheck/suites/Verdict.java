package eigencheck.suites;

/**
 * The outcome of a case: PASSED (the acceptance rule holds, or a planted defect was caught), FAILED
 * (a check failed, or a planted defect was not caught), ERROR (a level could not be run or read;
 * distinct from a failed check).
 *
 * @since 0.1
 */
public enum Verdict { PASSED, FAILED, ERROR }

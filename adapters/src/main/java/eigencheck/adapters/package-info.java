/**
 * Readers of solver output into one field model, and the input-error types every module that reads
 * files shares ({@link eigencheck.adapters.InputLocation}, {@link eigencheck.adapters.InputException}).
 */
package eigencheck.adapters;

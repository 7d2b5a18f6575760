/**
 * Internal: series representations and the solvers behind {@link eigencheck.oracle.Oracle}. Public
 * only so that the facade can reach it; not an API, may change without notice.
 */
package eigencheck.oracle.series;

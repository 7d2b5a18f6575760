/**
 * Internal helpers shared by the readers: unit conversion, duplicate-point detection, growable
 * primitive arrays. Not an API; may change without notice.
 */
package eigencheck.adapters.internal;

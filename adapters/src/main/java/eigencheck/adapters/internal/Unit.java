package eigencheck.adapters.internal;

import java.util.Locale;
import java.util.Map;

/**
 * A linear unit conversion value' = scale * value + offset, from a spec such as {@code mm} (to m),
 * {@code min} (to s), or {@code FROM->TO} between compatible units (degC, K, degF; lengths; times).
 * Temperatures: K = degC + 273.15, degF = 1.8 degC + 32 (common practice, SI Brochure 9th ed., 2019).
 */
public record Unit(double scale, double offset) {
    public static final Unit IDENTITY = new Unit(1, 0);

    private static final Map<String, Double> LENGTH = Map.of("m", 1.0, "mm", 1e-3, "cm", 1e-2, "um", 1e-6,
        "km", 1e3, "in", 0.0254, "ft", 0.3048);
    private static final Map<String, Double> TIME = Map.of("s", 1.0, "ms", 1e-3, "min", 60.0, "h", 3600.0,
        "d", 86400.0);

    public double apply(double v) {
        return scale * v + offset;
    }

    /**
     * @throws IllegalArgumentException with the allowed units if the spec is unknown or mixes kinds
     */
    public static Unit parse(String spec) {
        String s = spec.trim();
        int arrow = s.indexOf("->");
        if (arrow < 0) {
            String u = s.toLowerCase(Locale.ROOT);
            if (LENGTH.containsKey(u)) {
                return new Unit(LENGTH.get(u), 0);
            }
            if (TIME.containsKey(u)) {
                return new Unit(TIME.get(u), 0);
            }
            if (isTemperature(s)) {
                throw new IllegalArgumentException("unit \"" + spec + "\": a temperature needs its target, for example "
                    + s + "->K or " + s + "->degC");
            }
            throw unknown(spec);
        }
        String from = s.substring(0, arrow).trim();
        String to = s.substring(arrow + 2).trim();
        if (isTemperature(from) && isTemperature(to)) {
            Unit toKelvin = kelvin(from);
            Unit fromKelvin = kelvin(to);
            // v_K = a v + b; v_to = (v_K - b') / a'
            return new Unit(toKelvin.scale / fromKelvin.scale, (toKelvin.offset - fromKelvin.offset) / fromKelvin.scale);
        }
        String f = from.toLowerCase(Locale.ROOT);
        String t = to.toLowerCase(Locale.ROOT);
        if (LENGTH.containsKey(f) && LENGTH.containsKey(t)) {
            return new Unit(LENGTH.get(f) / LENGTH.get(t), 0);
        }
        if (TIME.containsKey(f) && TIME.containsKey(t)) {
            return new Unit(TIME.get(f) / TIME.get(t), 0);
        }
        throw unknown(spec);
    }

    private static boolean isTemperature(String u) {
        return u.equals("degC") || u.equals("K") || u.equals("degF");
    }

    private static Unit kelvin(String u) {
        switch (u) {
            case "K":
                return IDENTITY;
            case "degC":
                return new Unit(1, 273.15);
            default:
                return new Unit(1 / 1.8, 273.15 - 32 / 1.8);
        }
    }

    private static IllegalArgumentException unknown(String spec) {
        return new IllegalArgumentException("unit \"" + spec + "\" is not known; use a length (m mm cm um km in ft),"
            + " a time (s ms min h d), or FROM->TO between them or between degC, K and degF");
    }
}

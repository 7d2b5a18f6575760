package eigencheck.adapters;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * Outputs of one run at several times, in increasing time (a field with unknown time stands alone).
 *
 * @since 0.1
 */
public record FieldSeries(List<Field> fields) {
    public FieldSeries {
        if (fields.isEmpty()) {
            throw new IllegalArgumentException("a series needs at least one field");
        }
        List<Field> sorted = new ArrayList<>(fields);
        sorted.sort(Comparator.comparingDouble(Field::time));
        fields = List.copyOf(sorted);
    }

    public static FieldSeries of(Field f) {
        return new FieldSeries(List.of(f));
    }

    /** Times of the fields. */
    public double[] times() {
        return fields.stream().mapToDouble(Field::time).toArray();
    }

    /**
     * The field at time t (within a relative 1e-9 of the largest time), or null.
     */
    public Field at(double t) {
        double scale = Math.max(Math.abs(t), Math.abs(fields.get(fields.size() - 1).time()));
        for (Field f : fields) {
            if (Math.abs(f.time() - t) <= 1e-9 * Math.max(scale, 1e-300)) {
                return f;
            }
        }
        return null;
    }
}

package eigencheck.adapters.vtk;

import eigencheck.adapters.Field;
import eigencheck.adapters.FieldReader;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.Readers;
import java.io.ByteArrayInputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import javax.xml.stream.XMLStreamConstants;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamReader;

/**
 * PVD collections (a VTKFile of type Collection listing DataSet elements with a timestep and a file,
 * as ParaView writes them): each file is read with the reader of its extension, relative to the
 * collection's folder, and given the collection's time.
 */
public final class PvdReader implements FieldReader {
    @Override
    public String format() {
        return "pvd";
    }

    @Override
    public List<String> extensions() {
        return List.of("pvd");
    }

    @Override
    public FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        List<double[]> times = new ArrayList<>();
        List<String> files = new ArrayList<>();
        List<Integer> lines = new ArrayList<>();
        XMLStreamReader r = null;
        try {
            r = VtuReader.secureFactory().createXMLStreamReader(new ByteArrayInputStream(content));
            boolean collection = false;
            while (r.hasNext()) {
                if (r.next() != XMLStreamConstants.START_ELEMENT) {
                    continue;
                }
                int line = r.getLocation().getLineNumber();
                int column = r.getLocation().getColumnNumber();
                if (r.getLocalName().equals("VTKFile")) {
                    if (!"Collection".equals(r.getAttributeValue(null, "type"))) {
                        throw new InputException(Cause.MALFORMED, InputLocation.at(file, line, column, ""),
                            "VTKFile type \"" + r.getAttributeValue(null, "type") + "\"; a .pvd file is a Collection");
                    }
                    collection = true;
                } else if (r.getLocalName().equals("DataSet")) {
                    String step = r.getAttributeValue(null, "timestep");
                    String f = r.getAttributeValue(null, "file");
                    if (f == null || f.isBlank()) {
                        throw new InputException(Cause.MISSING, InputLocation.at(file, line, column, ""),
                            "DataSet has no file attribute");
                    }
                    double t = Double.NaN;
                    if (step != null) {
                        try {
                            t = Double.parseDouble(step.trim());
                        } catch (NumberFormatException e) {
                            throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, line, column, ""),
                                "timestep \"" + step + "\" is not a number");
                        }
                        if (!Double.isFinite(t)) {
                            throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, line, column, ""),
                                "timestep " + step + " is not finite");
                        }
                    }
                    times.add(new double[] {t});
                    files.add(f);
                    lines.add(line);
                }
            }
            if (!collection) {
                throw new InputException(Cause.MALFORMED, InputLocation.of(file), "no VTKFile element of type Collection");
            }
        } catch (XMLStreamException e) {
            var at = e.getLocation();
            throw new InputException(Cause.MALFORMED, at == null ? InputLocation.of(file)
                : InputLocation.at(file, at.getLineNumber(), at.getColumnNumber(), ""), "not well-formed XML: "
                + e.getMessage().lines().reduce((a, b) -> b).orElse(""));
        } finally {
            if (r != null) {
                try {
                    r.close();
                } catch (XMLStreamException ignored) {
                    // nothing to release
                }
            }
        }
        if (files.isEmpty()) {
            throw new InputException(Cause.MISSING, InputLocation.of(file), "the collection lists no DataSet");
        }
        Set<Double> seen = new HashSet<>();
        Path dir = file.toAbsolutePath().getParent();
        List<Field> fields = new ArrayList<>();
        for (int i = 0; i < files.size(); i++) {
            double t = times.get(i)[0];
            if (!Double.isNaN(t) && !seen.add(t)) {
                throw new InputException(Cause.INVALID_VALUE, InputLocation.at(file, lines.get(i), 0, ""),
                    "a second DataSet at timestep " + t + "; eigencheck reads one file per time (multi-part"
                        + " collections are not supported)");
            }
            Path target = dir.resolve(files.get(i)).normalize();
            FieldSeries part = Readers.read(target, options.withFormat(null));
            for (Field f : part.fields()) {
                fields.add(Double.isNaN(t) ? f : f.withTime(t));
            }
        }
        return new FieldSeries(fields);
    }
}

package eigencheck.adapters.vtk;

import eigencheck.adapters.Field;
import eigencheck.adapters.FieldReader;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.internal.Duplicates;
import java.io.ByteArrayInputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Base64;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.zip.DataFormatException;
import java.util.zip.Inflater;
import javax.xml.stream.XMLInputFactory;
import javax.xml.stream.XMLStreamConstants;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamReader;

/**
 * VTK XML UnstructuredGrid files (.vtu; "VTK File Formats", VTK User's Guide, Kitware, 11th ed.,
 * 2010, ch. 19, "XML File Formats"): DataArrays in ascii, base64 binary with UInt32 or UInt64 size
 * headers, zlib-compressed blocks (vtkZLibDataCompressor), and appended data, raw or base64. Parsed
 * with the JDK's StAX reader with DTDs and external entities disabled; the raw appended block is
 * cut off before XML parsing and addressed by byte offset.
 */
public final class VtuReader implements FieldReader {
    private static final XMLInputFactory XML = secureFactory();

    static XMLInputFactory secureFactory() {
        XMLInputFactory f = XMLInputFactory.newFactory();
        f.setProperty(XMLInputFactory.SUPPORT_DTD, false);
        f.setProperty(XMLInputFactory.IS_SUPPORTING_EXTERNAL_ENTITIES, false);
        f.setProperty(XMLInputFactory.IS_REPLACING_ENTITY_REFERENCES, false);
        return f;
    }

    @Override
    public String format() {
        return "vtu";
    }

    @Override
    public List<String> extensions() {
        return List.of("vtu");
    }

    @Override
    public FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        return FieldSeries.of(new Parse(file, content).run());
    }

    /** One DataArray element: its attributes and, for inline data, its text. */
    private record ArrayElement(Map<String, String> attributes, String text, int line, int column) {
        String get(String name) {
            return attributes.get(name);
        }
    }

    private static final class Parse {
        private final Path file;
        private final byte[] content;
        private ByteOrder order = ByteOrder.LITTLE_ENDIAN;
        private int headerSize = 4;
        private boolean compressed;
        private int appendedStart = -1; // first byte after '_'
        private boolean appendedBase64;
        private int points = -1;
        private int cells = -1;
        private int pieces;
        private ArrayElement pointsArray;
        private final Map<String, ArrayElement> cellArrays = new HashMap<>();
        private final List<ArrayElement> pointData = new ArrayList<>();
        private final List<ArrayElement> cellData = new ArrayList<>();
        private ArrayElement timeArray;

        Parse(Path file, byte[] content) {
            this.file = file;
            this.content = content;
        }

        Field run() throws InputException {
            byte[] xml = content;
            int appended = indexOf(content, "<AppendedData".getBytes(StandardCharsets.US_ASCII), 0);
            if (appended >= 0) {
                int close = indexOf(content, new byte[] {'>'}, appended);
                if (close < 0) {
                    throw error(0, 0, "the AppendedData element is not closed (truncated?)");
                }
                String tag = new String(content, appended, close - appended, StandardCharsets.ISO_8859_1);
                appendedBase64 = tag.contains("encoding=\"base64\"");
                int underscore = indexOf(content, new byte[] {'_'}, close);
                if (underscore < 0) {
                    throw error(0, 0, "AppendedData has no '_' before its data (truncated?)");
                }
                appendedStart = underscore + 1;
                byte[] end = "</VTKFile>".getBytes(StandardCharsets.US_ASCII);
                xml = new byte[appended + end.length];
                System.arraycopy(content, 0, xml, 0, appended);
                System.arraycopy(end, 0, xml, appended, end.length);
            }
            structure(xml);
            if (pieces != 1) {
                throw error(0, 0, pieces == 0 ? "no Piece element; is this an UnstructuredGrid file?"
                    : "the file has " + pieces + " pieces; eigencheck reads one piece per file (write a serial file,"
                    + " or one file per piece without shared points)");
            }
            if (pointsArray == null) {
                throw error(0, 0, "the Piece has no Points DataArray");
            }
            double[] xyz = decode(pointsArray, 3L * points, "Points");
            int[] dup = Duplicates.find(xyz, 3);
            if (dup != null) {
                throw error(pointsArray.line, pointsArray.column, "points " + dup[0] + " and " + dup[1]
                    + " have the same coordinates; each point once");
            }
            Field.Builder b = new Field.Builder(3, xyz);
            if (timeArray != null) {
                double[] t = decode(timeArray, 1, "TimeValue");
                b.time(t[0]);
            }
            try {
                if (cells > 0) {
                    for (String name : new String[] {"connectivity", "offsets", "types"}) {
                        if (!cellArrays.containsKey(name)) {
                            throw error(0, 0, "the Cells element has no \"" + name + "\" DataArray");
                        }
                    }
                    double[] off = decode(cellArrays.get("offsets"), cells, "offsets");
                    int total = (int) index(off[cells - 1], "offsets", Integer.MAX_VALUE, cellArrays.get("offsets"));
                    double[] conn = decode(cellArrays.get("connectivity"), total, "connectivity");
                    double[] typ = decode(cellArrays.get("types"), cells, "types");
                    int[] offsets = new int[cells + 1];
                    for (int i = 0; i < cells; i++) {
                        offsets[i + 1] = (int) index(off[i], "offsets", total + 1, cellArrays.get("offsets"));
                        if (offsets[i + 1] <= offsets[i]) {
                            throw error(cellArrays.get("offsets").line, 0, "offsets: cell " + i + " has no nodes");
                        }
                    }
                    int[] connectivity = new int[total];
                    for (int i = 0; i < total; i++) {
                        connectivity[i] = (int) index(conn[i], "connectivity", points, cellArrays.get("connectivity"));
                    }
                    byte[] types = new byte[cells];
                    for (int i = 0; i < cells; i++) {
                        types[i] = (byte) index(typ[i], "types", 256, cellArrays.get("types"));
                    }
                    b.cells(types, offsets, connectivity);
                }
                for (ArrayElement a : pointData) {
                    int comps = components(a);
                    b.pointData(name(a), comps, decode(a, (long) comps * points, name(a)));
                }
                for (ArrayElement a : cellData) {
                    int comps = components(a);
                    b.cellData(name(a), comps, decode(a, (long) comps * Math.max(cells, 0), name(a)));
                }
            } catch (IllegalArgumentException e) {
                throw error(0, 0, e.getMessage());
            }
            return b.build();
        }

        private static String name(ArrayElement a) {
            String n = a.get("Name");
            return n == null ? "unnamed" : n;
        }

        private int components(ArrayElement a) throws InputException {
            String c = a.get("NumberOfComponents");
            if (c == null) {
                return 1;
            }
            try {
                int v = Integer.parseInt(c.trim());
                if (v < 1 || v > 64) {
                    throw error(a.line, a.column, "NumberOfComponents " + v + " is out of range 1..64");
                }
                return v;
            } catch (NumberFormatException e) {
                throw error(a.line, a.column, "NumberOfComponents \"" + c + "\" is not a whole number");
            }
        }

        private void structure(byte[] xml) throws InputException {
            XMLStreamReader r = null;
            try {
                r = XML.createXMLStreamReader(new ByteArrayInputStream(xml));
                String section = "";
                boolean sawRoot = false;
                while (r.hasNext()) {
                    int event = r.next();
                    if (event != XMLStreamConstants.START_ELEMENT) {
                        if (event == XMLStreamConstants.END_ELEMENT) {
                            String n = r.getLocalName();
                            if (n.equals("PointData") || n.equals("CellData") || n.equals("Points") || n.equals("Cells")
                                || n.equals("FieldData")) {
                                section = "";
                            }
                        }
                        continue;
                    }
                    String name = r.getLocalName();
                    int line = r.getLocation().getLineNumber();
                    int column = r.getLocation().getColumnNumber();
                    switch (name) {
                        case "VTKFile" -> {
                            sawRoot = true;
                            String type = r.getAttributeValue(null, "type");
                            if (!"UnstructuredGrid".equals(type)) {
                                throw error(line, column, "VTKFile type \"" + type + "\"; this reader takes"
                                    + " UnstructuredGrid (.vtu)");
                            }
                            if ("BigEndian".equals(r.getAttributeValue(null, "byte_order"))) {
                                order = ByteOrder.BIG_ENDIAN;
                            }
                            String header = r.getAttributeValue(null, "header_type");
                            if (header != null) {
                                if (header.equals("UInt64")) {
                                    headerSize = 8;
                                } else if (!header.equals("UInt32")) {
                                    throw error(line, column, "header_type \"" + header + "\"; expected UInt32 or UInt64");
                                }
                            }
                            String compressor = r.getAttributeValue(null, "compressor");
                            if (compressor != null && !compressor.isEmpty()) {
                                if (!compressor.equals("vtkZLibDataCompressor")) {
                                    throw error(line, column, "compressor \"" + compressor + "\" is not supported; write"
                                        + " uncompressed or zlib-compressed data");
                                }
                                compressed = true;
                            }
                        }
                        case "Piece" -> {
                            pieces++;
                            points = attributeCount(r, "NumberOfPoints", line, column);
                            String c = r.getAttributeValue(null, "NumberOfCells");
                            cells = c == null ? 0 : attributeCount(r, "NumberOfCells", line, column);
                        }
                        case "PointData", "CellData", "Points", "Cells", "FieldData" -> section = name;
                        case "DataArray" -> {
                            Map<String, String> attributes = new HashMap<>();
                            for (int i = 0; i < r.getAttributeCount(); i++) {
                                attributes.put(r.getAttributeLocalName(i), r.getAttributeValue(i));
                            }
                            String format = attributes.getOrDefault("format", "ascii");
                            String text = null;
                            if (!format.equals("appended")) {
                                text = r.getElementText();
                            }
                            ArrayElement a = new ArrayElement(attributes, text, line, column);
                            switch (section) {
                                case "Points" -> pointsArray = a;
                                case "Cells" -> cellArrays.put(attributes.getOrDefault("Name", ""), a);
                                case "PointData" -> pointData.add(a);
                                case "CellData" -> cellData.add(a);
                                case "FieldData" -> {
                                    if ("TimeValue".equals(attributes.get("Name"))) {
                                        timeArray = a;
                                    }
                                }
                                default -> throw error(line, column, "a DataArray outside Points, Cells, PointData,"
                                    + " CellData or FieldData");
                            }
                        }
                        default -> {
                        }
                    }
                }
                if (!sawRoot) {
                    throw error(0, 0, "no VTKFile element; is this a VTK XML file?");
                }
            } catch (XMLStreamException e) {
                var at = e.getLocation();
                throw error(at == null ? 0 : at.getLineNumber(), at == null ? 0 : at.getColumnNumber(),
                    "not well-formed XML: " + firstLine(e.getMessage()));
            } finally {
                if (r != null) {
                    try {
                        r.close();
                    } catch (XMLStreamException ignored) {
                        // nothing to release
                    }
                }
            }
        }

        private int attributeCount(XMLStreamReader r, String name, int line, int column) throws InputException {
            String v = r.getAttributeValue(null, name);
            if (v == null) {
                throw error(line, column, "Piece has no " + name);
            }
            try {
                long n = Long.parseLong(v.trim());
                if (n < 0 || n > content.length) {
                    throw error(line, column, name + " " + n + " cannot fit in a file of " + content.length + " bytes");
                }
                return (int) n;
            } catch (NumberFormatException e) {
                throw error(line, column, name + " \"" + v + "\" is not a whole number");
            }
        }

        private static String firstLine(String m) {
            if (m == null) {
                return "unreadable";
            }
            int cut = m.indexOf('\n');
            String s = cut < 0 ? m : m.substring(0, cut);
            int msg = m.indexOf("Message: ");
            return msg >= 0 ? m.substring(msg + 9).trim() : s;
        }

        private double index(double v, String what, long limit, ArrayElement a) throws InputException {
            if (v != Math.rint(v) || v < 0 || v >= limit) {
                throw error(a.line, a.column, what + ": " + v + " is not an index in [0, " + limit + ")");
            }
            return v;
        }

        // ------------------------------------------------------------- data

        private double[] decode(ArrayElement a, long n, String what) throws InputException {
            String type = a.get("type");
            if (type == null) {
                throw error(a.line, a.column, what + ": DataArray has no type");
            }
            int size = switch (type) {
                case "Int8", "UInt8" -> 1;
                case "Int16", "UInt16" -> 2;
                case "Int32", "UInt32", "Float32" -> 4;
                case "Int64", "UInt64", "Float64" -> 8;
                default -> throw error(a.line, a.column, what + ": type \"" + type + "\"; expected Int8 ... UInt64,"
                    + " Float32 or Float64");
            };
            if (n > content.length * 4L + 16) {
                throw error(a.line, a.column, what + ": " + n + " values cannot fit in the file");
            }
            String format = a.attributes().getOrDefault("format", "ascii");
            double[] v;
            switch (format) {
                case "ascii" -> v = ascii(a, n, what);
                case "binary" -> v = convert(ByteBuffer.wrap(inlineBinary(a, what)), type, size, n, a, what);
                case "appended" -> v = convert(appended(a, what), type, size, n, a, what);
                default -> throw error(a.line, a.column, what + ": format \"" + format + "\"; expected ascii, binary or"
                    + " appended");
            }
            for (int i = 0; i < v.length; i++) {
                if (!Double.isFinite(v[i])) {
                    throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, a.line, a.column, ""), what
                        + ": value " + i + " is " + v[i] + "; the solver diverged or wrote a placeholder");
                }
            }
            return v;
        }

        private double[] ascii(ArrayElement a, long n, String what) throws InputException {
            String text = a.text() == null ? "" : a.text();
            double[] v = new double[(int) n];
            int count = 0;
            int i = 0;
            int len = text.length();
            while (true) {
                while (i < len && Character.isWhitespace(text.charAt(i))) {
                    i++;
                }
                if (i >= len) {
                    break;
                }
                int start = i;
                while (i < len && !Character.isWhitespace(text.charAt(i))) {
                    i++;
                }
                if (count >= n) {
                    throw error(a.line, a.column, what + ": more than the " + n + " values the header gives");
                }
                String token = text.substring(start, i);
                try {
                    v[count++] = Double.parseDouble(token);
                } catch (NumberFormatException e) {
                    throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, a.line, a.column, ""), what
                        + ": value " + (count - 1) + " \"" + (token.length() > 30 ? token.substring(0, 30) : token)
                        + "\" is not a number");
                }
            }
            if (count != n) {
                throw error(a.line, a.column, what + ": " + count + " values, expected " + n + " (truncated?)");
            }
            return v;
        }

        private byte[] inlineBinary(ArrayElement a, String what) throws InputException {
            String text = a.text() == null ? "" : a.text().replaceAll("\\s+", "");
            return compressed ? compressedBase64(text, a, what) : uncompressedBase64(text, a, what);
        }

        private byte[] base64(String text, ArrayElement a, String what) throws InputException {
            try {
                return Base64.getDecoder().decode(text);
            } catch (IllegalArgumentException e) {
                throw error(a.line, a.column, what + ": the base64 data are damaged (" + e.getMessage() + ")");
            }
        }

        private long header(ByteBuffer buf) {
            return headerSize == 8 ? buf.getLong() : buf.getInt() & 0xffffffffL;
        }

        private byte[] uncompressedBase64(String text, ArrayElement a, String what) throws InputException {
            byte[] all = base64(text, a, what);
            if (all.length >= headerSize) {
                long size = header(ByteBuffer.wrap(all).order(order));
                if (size == all.length - headerSize) {
                    return java.util.Arrays.copyOfRange(all, headerSize, all.length);
                }
            }
            // header and data encoded separately
            int headerChars = (headerSize + 2) / 3 * 4;
            if (text.length() < headerChars) {
                throw error(a.line, a.column, what + ": the binary data end before their size header (truncated?)");
            }
            byte[] h = base64(text.substring(0, headerChars), a, what);
            long size = header(ByteBuffer.wrap(h).order(order));
            byte[] data = base64(text.substring(headerChars), a, what);
            if (size > data.length) {
                throw error(a.line, a.column, what + ": the header gives " + size + " bytes, the data hold " + data.length
                    + " (truncated?)");
            }
            return java.util.Arrays.copyOf(data, (int) size);
        }

        private byte[] compressedBase64(String text, ArrayElement a, String what) throws InputException {
            int firstChars = (3 * headerSize + 2) / 3 * 4;
            if (text.length() < firstChars) {
                throw error(a.line, a.column, what + ": the compressed data end before their header (truncated?)");
            }
            ByteBuffer first = ByteBuffer.wrap(base64(text.substring(0, firstChars), a, what)).order(order);
            long blocks = header(first);
            if (blocks < 0 || blocks > text.length()) {
                throw error(a.line, a.column, what + ": the compression header gives " + blocks + " blocks");
            }
            int headerChars = (int) (((3 + blocks) * headerSize + 2) / 3 * 4);
            if (text.length() < headerChars) {
                throw error(a.line, a.column, what + ": the compressed data end inside their header (truncated?)");
            }
            ByteBuffer h = ByteBuffer.wrap(base64(text.substring(0, headerChars), a, what)).order(order);
            byte[] data = base64(text.substring(headerChars), a, what);
            return inflate(h, ByteBuffer.wrap(data), a, what);
        }

        /** zlib blocks after a header [blocks, blockSize, lastBlockSize, compressedSize...]. */
        private byte[] inflate(ByteBuffer header, ByteBuffer data, ArrayElement a, String what) throws InputException {
            long blocks = header(header);
            long blockSize = header(header);
            long last = header(header);
            if (blocks < 0 || blockSize < 0 || last < 0 || blocks > data.remaining() + 1 || blockSize > 1L << 31
                || last > 1L << 31 || (blocks > 0 && (blocks - 1) * blockSize + (last == 0 ? blockSize : last) > 1L << 31)) {
                throw error(a.line, a.column, what + ": the compression header (" + blocks + " blocks of " + blockSize
                    + " bytes) is damaged");
            }
            long total = blocks == 0 ? 0 : (blocks - 1) * blockSize + (last == 0 ? blockSize : last);
            if (total > 64L * content.length + (1 << 20)) {
                throw error(a.line, a.column, what + ": the compression header claims " + total + " bytes, far more"
                    + " than the file could hold");
            }
            byte[] out = new byte[(int) total];
            int written = 0;
            Inflater inflater = new Inflater();
            try {
                for (int k = 0; k < blocks; k++) {
                    if (header.remaining() < headerSize) {
                        throw error(a.line, a.column, what + ": the compression header ends early (truncated?)");
                    }
                    long csize = header(header);
                    if (csize < 0 || csize > data.remaining()) {
                        throw error(a.line, a.column, what + ": block " + k + " claims " + csize + " bytes, "
                            + data.remaining() + " remain (truncated?)");
                    }
                    int expected = (int) (k == blocks - 1 ? (last == 0 ? blockSize : last) : blockSize);
                    byte[] block = new byte[(int) csize];
                    data.get(block);
                    inflater.reset();
                    inflater.setInput(block);
                    int got = inflater.inflate(out, written, expected);
                    if (got != expected || !inflater.finished()) {
                        throw error(a.line, a.column, what + ": block " + k + " inflates to " + got + " bytes, not "
                            + expected + " (damaged data?)");
                    }
                    written += got;
                }
            } catch (DataFormatException e) {
                throw error(a.line, a.column, what + ": the zlib data are damaged (" + e.getMessage() + ")");
            } finally {
                inflater.end();
            }
            return out;
        }

        /** The array's bytes: a view into the file for raw uncompressed data, else a decoded copy. */
        private ByteBuffer appended(ArrayElement a, String what) throws InputException {
            if (appendedStart < 0) {
                throw error(a.line, a.column, what + ": format=\"appended\" but the file has no AppendedData");
            }
            long offset;
            try {
                offset = Long.parseLong(a.attributes().getOrDefault("offset", "").trim());
            } catch (NumberFormatException e) {
                throw error(a.line, a.column, what + ": the offset attribute is missing or not a number");
            }
            if (offset < 0 || appendedStart + offset > content.length) {
                throw error(a.line, a.column, what + ": offset " + offset + " is beyond the end of the appended data");
            }
            int at = (int) (appendedStart + offset);
            if (appendedBase64) {
                int end = at;
                while (end < content.length && content[end] != '<' && content[end] != '\n') {
                    end++;
                }
                String text = new String(content, at, end - at, StandardCharsets.ISO_8859_1);
                return ByteBuffer.wrap(compressed ? compressedBase64(text, a, what) : uncompressedBase64(text, a, what));
            }
            ByteBuffer buf = ByteBuffer.wrap(content).order(order);
            buf.position(at);
            if (compressed) {
                if (buf.remaining() < 3 * headerSize) {
                    throw bytesError(at, what + ": the appended data end before their header (truncated?)");
                }
                int start = buf.position();
                long blocks = header(buf);
                if (blocks < 0 || blocks > (content.length - start) / headerSize
                    || (3 + blocks) * headerSize > content.length - start) {
                    throw bytesError(at, what + ": the compression header gives " + blocks + " blocks (damaged?)");
                }
                ByteBuffer header = ByteBuffer.wrap(content, start, (int) ((3 + blocks) * headerSize)).slice().order(order);
                ByteBuffer data = ByteBuffer.wrap(content, start + (int) ((3 + blocks) * headerSize),
                    content.length - start - (int) ((3 + blocks) * headerSize)).slice();
                return ByteBuffer.wrap(inflate(header, data, a, what));
            }
            if (buf.remaining() < headerSize) {
                throw bytesError(at, what + ": the appended data end before their size header (truncated?)");
            }
            long size = header(buf);
            if (size < 0 || size > buf.remaining()) {
                throw bytesError(at, what + ": the header gives " + size + " bytes, " + buf.remaining()
                    + " remain (truncated?)");
            }
            return ByteBuffer.wrap(content, buf.position(), (int) size).slice();
        }

        private double[] convert(ByteBuffer bytes, String type, int size, long n, ArrayElement a, String what)
            throws InputException {
            if (bytes.remaining() != n * size) {
                throw error(a.line, a.column, what + ": " + bytes.remaining() + " bytes of " + type + " data, expected " + n
                    + " values (" + n * size + " bytes)");
            }
            ByteBuffer buf = bytes.slice().order(order);
            double[] v = new double[(int) n];
            switch (type) {
                case "Float64" -> buf.asDoubleBuffer().get(v);
                case "Float32" -> {
                    var f = buf.asFloatBuffer();
                    for (int i = 0; i < n; i++) {
                        v[i] = f.get(i);
                    }
                }
                case "Int32" -> {
                    var f = buf.asIntBuffer();
                    for (int i = 0; i < n; i++) {
                        v[i] = f.get(i);
                    }
                }
                case "UInt32" -> {
                    var f = buf.asIntBuffer();
                    for (int i = 0; i < n; i++) {
                        v[i] = f.get(i) & 0xffffffffL;
                    }
                }
                case "Int64", "UInt64" -> {
                    var f = buf.asLongBuffer();
                    for (int i = 0; i < n; i++) {
                        v[i] = f.get(i);
                    }
                }
                case "Int16" -> {
                    for (int i = 0; i < n; i++) {
                        v[i] = buf.getShort(2 * i);
                    }
                }
                case "UInt16" -> {
                    for (int i = 0; i < n; i++) {
                        v[i] = buf.getShort(2 * i) & 0xffff;
                    }
                }
                case "Int8" -> {
                    for (int i = 0; i < n; i++) {
                        v[i] = buf.get(i);
                    }
                }
                default -> {
                    for (int i = 0; i < n; i++) {
                        v[i] = buf.get(i) & 0xff;
                    }
                }
            }
            return v;
        }

        private static int indexOf(byte[] hay, byte[] needle, int from) {
            outer:
            for (int i = from; i <= hay.length - needle.length; i++) {
                for (int j = 0; j < needle.length; j++) {
                    if (hay[i + j] != needle[j]) {
                        continue outer;
                    }
                }
                return i;
            }
            return -1;
        }

        private InputException error(int line, int column, String message) {
            return new InputException(Cause.MALFORMED, line > 0 ? InputLocation.at(file, line, column, "")
                : InputLocation.of(file), message);
        }

        private InputException bytesError(long offset, String message) {
            return new InputException(Cause.MALFORMED, new InputLocation(file, 0, 0, offset, ""), message);
        }
    }
}

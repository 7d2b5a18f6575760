package eigencheck.suites.report;

import eigencheck.suites.Results;
import java.awt.BasicStroke;
import java.awt.Color;
import java.util.Locale;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.svg.SVGGraphics2D;

/** A log-log convergence plot (JFreeChart, drawn to SVG by JFreeSVG) with reference slope lines. */
public final class Plot {
    private Plot() {
    }

    /** SVG of the case's metrics against h, with a dashed line of the expected order through the finest point. */
    public static String svg(Results.CaseResult c, double[] h, double expectedOrder) {
        XYSeriesCollection data = new XYSeriesCollection();
        for (Results.Metric m : c.metrics()) {
            XYSeries s = new XYSeries(m.name());
            for (int i = 0; i < h.length; i++) {
                if (m.errors()[i] > 0) {
                    s.add(h[i], m.errors()[i]);
                }
            }
            data.addSeries(s);
        }
        int measured = data.getSeriesCount();
        if (!Double.isNaN(expectedOrder) && !c.metrics().isEmpty()) {
            for (Results.Metric m : c.metrics()) {
                int last = h.length - 1;
                if (!(m.errors()[last] > 0)) {
                    continue;
                }
                // drawn a factor 2 below the finest point so that it does not hide a matching series
                XYSeries ref = new XYSeries(String.format(Locale.ROOT, "expected slope %.3g", expectedOrder));
                for (double hi : h) {
                    ref.add(hi, 0.5 * m.errors()[last] * Math.pow(hi / h[last], expectedOrder));
                }
                data.addSeries(ref);
                break;
            }
        }
        JFreeChart chart = ChartFactory.createXYLineChart(c.name(), "cell size h", "error", data, PlotOrientation.VERTICAL,
            true, false, false);
        XYPlot plot = chart.getXYPlot();
        LogAxis x = new LogAxis("cell size h");
        LogAxis y = new LogAxis("error");
        x.setSmallestValue(1e-300);
        y.setSmallestValue(1e-300);
        for (LogAxis a : new LogAxis[] {x, y}) {
            a.setNumberFormatOverride(new java.text.DecimalFormat("0.#E0",
                java.text.DecimalFormatSymbols.getInstance(Locale.ROOT)));
        }
        plot.setDomainAxis(x);
        plot.setRangeAxis(y);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(Color.LIGHT_GRAY);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, true);
        for (int s = 0; s < data.getSeriesCount(); s++) {
            if (s >= measured) {
                r.setSeriesStroke(s, new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 1f,
                    new float[] {6f, 4f}, 0f));
                r.setSeriesShapesVisible(s, false);
                r.setSeriesPaint(s, Color.GRAY);
            }
        }
        plot.setRenderer(r);
        SVGGraphics2D g = new SVGGraphics2D(640, 420);
        chart.draw(g, new java.awt.Rectangle(0, 0, 640, 420));
        return g.getSVGElement();
    }
}

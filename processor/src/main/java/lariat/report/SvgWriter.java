package lariat.report;

import java.util.Locale;

/**
 * A minimal writer of Scalable Vector Graphics documents (W3C SVG 1.1): lines, polylines, rectangles
 * and text, with XML escaping of every attribute and text value. Coordinates are user units with the
 * origin at the top left. Not thread-safe; {@link #finish()} closes the document once.
 */
public final class SvgWriter {

    private final StringBuilder out = new StringBuilder();
    private int openGroups;
    private boolean finished;

    /** Starts a document of the given size. */
    public SvgWriter(double width, double height) {
        if (!(width > 0) || !(height > 0)) {
            throw new IllegalArgumentException("width and height must be positive: " + width + " x " + height);
        }
        out.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n")
                .append("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"").append(num(width))
                .append("\" height=\"").append(num(height)).append("\" viewBox=\"0 0 ").append(num(width))
                .append(' ').append(num(height)).append("\" font-family=\"sans-serif\">\n");
    }

    /** Opens a group with a class attribute (for styling and for readers of the file). */
    public SvgWriter beginGroup(String cssClass) {
        check();
        out.append("<g class=\"").append(escape(cssClass)).append("\">\n");
        openGroups++;
        return this;
    }

    public SvgWriter endGroup() {
        check();
        if (openGroups == 0) {
            throw new IllegalStateException("no open group");
        }
        out.append("</g>\n");
        openGroups--;
        return this;
    }

    public SvgWriter title(String text) {
        check();
        out.append("<title>").append(escape(text)).append("</title>\n");
        return this;
    }

    public SvgWriter rect(double x, double y, double w, double h, String stroke, String fill) {
        check();
        out.append("<rect x=\"").append(num(x)).append("\" y=\"").append(num(y)).append("\" width=\"")
                .append(num(w)).append("\" height=\"").append(num(h)).append("\" stroke=\"").append(escape(stroke))
                .append("\" fill=\"").append(escape(fill)).append("\"/>\n");
        return this;
    }

    public SvgWriter line(double x1, double y1, double x2, double y2, String stroke, double width, String dash) {
        check();
        out.append("<line x1=\"").append(num(x1)).append("\" y1=\"").append(num(y1)).append("\" x2=\"")
                .append(num(x2)).append("\" y2=\"").append(num(y2)).append("\" stroke=\"").append(escape(stroke))
                .append("\" stroke-width=\"").append(num(width)).append('"');
        dash(dash);
        out.append("/>\n");
        return this;
    }

    /** A polyline through the points {@code (xs[i], ys[i])}; both arrays have the same length. */
    public SvgWriter polyline(double[] xs, double[] ys, String stroke, double width, String dash) {
        check();
        if (xs.length != ys.length) {
            throw new IllegalArgumentException("xs and ys differ in length: " + xs.length + " vs " + ys.length);
        }
        out.append("<polyline fill=\"none\" stroke=\"").append(escape(stroke)).append("\" stroke-width=\"")
                .append(num(width)).append('"');
        dash(dash);
        out.append(" points=\"");
        for (int i = 0; i < xs.length; i++) {
            out.append(i == 0 ? "" : " ").append(num(xs[i])).append(',').append(num(ys[i]));
        }
        out.append("\"/>\n");
        return this;
    }

    /**
     * Text at {@code (x, y)}; {@code anchor} is {@code start}, {@code middle} or {@code end};
     * {@code rotate} in degrees about the anchor point (0 for none).
     */
    public SvgWriter text(double x, double y, String text, String anchor, double size, double rotate) {
        check();
        out.append("<text x=\"").append(num(x)).append("\" y=\"").append(num(y)).append("\" font-size=\"")
                .append(num(size)).append("\" text-anchor=\"").append(escape(anchor)).append('"');
        if (rotate != 0) {
            out.append(" transform=\"rotate(").append(num(rotate)).append(' ').append(num(x)).append(' ')
                    .append(num(y)).append(")\"");
        }
        out.append('>').append(escape(text)).append("</text>\n");
        return this;
    }

    /** Closes open groups and the document and returns it. */
    public String finish() {
        check();
        while (openGroups > 0) {
            endGroup();
        }
        out.append("</svg>\n");
        finished = true;
        return out.toString();
    }

    private void dash(String dash) {
        if (dash != null && !dash.isEmpty()) {
            out.append(" stroke-dasharray=\"").append(escape(dash)).append('"');
        }
    }

    private void check() {
        if (finished) {
            throw new IllegalStateException("document already finished");
        }
    }

    /** XML escaping of the five predefined entities (W3C XML 1.0, section 4.6). */
    static String escape(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> b.append("&amp;");
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&apos;");
                default -> {
                    if (c >= 0x20 || c == '\t' || c == '\n' || c == '\r') {
                        b.append(c);
                    }
                }
            }
        }
        return b.toString();
    }

    static String num(double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("coordinate is not finite: " + v);
        }
        return String.format(Locale.ROOT, "%.2f", v);
    }
}

package lariat.report.demo;

import java.util.Locale;

/**
 * A small writer of SVG 1.1 elements into a string; every attribute value and text is XML-escaped,
 * coordinates are written with one decimal.
 */
final class Svg {

    /** Colours for series, chosen to stay distinct on white and in greyscale order. */
    static final String[] PALETTE = {
        "#1f5fa8", "#d9541e", "#2e8b3e", "#8e3fa8", "#b8860b", "#0f8f8f", "#c2185b", "#5d6d7e", "#6b8e23", "#7b3f00"};
    static final String POSITIVE = "#1f5fa8";
    static final String NEGATIVE = "#d9541e";
    static final String CHANGE = "#b00020";

    private final StringBuilder out = new StringBuilder(8192);

    Svg(String cssClass, double width, double height, String label) {
        out.append("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"").append(escape(cssClass))
                .append("\" width=\"").append(num(width)).append("\" height=\"").append(num(height))
                .append("\" viewBox=\"0 0 ").append(num(width)).append(' ').append(num(height))
                .append("\" role=\"img\" font-family=\"sans-serif\" font-size=\"11\">\n");
        out.append("<title>").append(escape(label)).append("</title>\n");
    }

    Svg line(double x1, double y1, double x2, double y2, String stroke, double width, String dash) {
        out.append("<line x1=\"").append(num(x1)).append("\" y1=\"").append(num(y1)).append("\" x2=\"")
                .append(num(x2)).append("\" y2=\"").append(num(y2)).append("\" stroke=\"").append(stroke)
                .append("\" stroke-width=\"").append(num(width)).append('"');
        if (dash != null) {
            out.append(" stroke-dasharray=\"").append(dash).append('"');
        }
        out.append("/>\n");
        return this;
    }

    Svg rect(double x, double y, double w, double h, String fill, String tooltip) {
        out.append("<rect x=\"").append(num(x)).append("\" y=\"").append(num(y)).append("\" width=\"")
                .append(num(w)).append("\" height=\"").append(num(h)).append("\" fill=\"").append(fill).append('"');
        return closeWithTooltip("rect", tooltip);
    }

    Svg text(double x, double y, String anchor, String text) {
        out.append("<text x=\"").append(num(x)).append("\" y=\"").append(num(y)).append("\" text-anchor=\"")
                .append(anchor).append("\">").append(escape(text)).append("</text>\n");
        return this;
    }

    Svg rotatedText(double x, double y, String text) {
        out.append("<text x=\"").append(num(x)).append("\" y=\"").append(num(y))
                .append("\" text-anchor=\"middle\" transform=\"rotate(-90 ").append(num(x)).append(' ')
                .append(num(y)).append(")\">").append(escape(text)).append("</text>\n");
        return this;
    }

    Svg polyline(double[] xs, double[] ys, String stroke, String seriesName) {
        out.append("<polyline class=\"series\" fill=\"none\" stroke=\"").append(stroke)
                .append("\" stroke-width=\"1.8\" data-channel=\"").append(escape(seriesName)).append("\" points=\"");
        for (int i = 0; i < xs.length; i++) {
            if (i > 0) {
                out.append(' ');
            }
            out.append(num(xs[i])).append(',').append(num(ys[i]));
        }
        out.append('"');
        return closeWithTooltip("polyline", seriesName);
    }

    /** A downward triangle centred at (x, y). */
    Svg marker(double x, double y, String fill, String tooltip) {
        out.append("<path class=\"alert\" d=\"M").append(num(x - 5)).append(' ').append(num(y - 5)).append(" L")
                .append(num(x + 5)).append(' ').append(num(y - 5)).append(" L").append(num(x)).append(' ')
                .append(num(y + 4)).append(" Z\" fill=\"").append(fill).append('"');
        return closeWithTooltip("path", tooltip);
    }

    String finish() {
        out.append("</svg>\n");
        return out.toString();
    }

    private Svg closeWithTooltip(String element, String tooltip) {
        if (tooltip == null) {
            out.append("/>\n");
        } else {
            out.append("><title>").append(escape(tooltip)).append("</title></").append(element).append(">\n");
        }
        return this;
    }

    static String num(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }

    static String escape(String s) {
        StringBuilder b = new StringBuilder(s.length() + 8);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '<':
                    b.append("&lt;");
                    break;
                case '>':
                    b.append("&gt;");
                    break;
                case '&':
                    b.append("&amp;");
                    break;
                case '"':
                    b.append("&quot;");
                    break;
                case '\'':
                    b.append("&#39;");
                    break;
                default:
                    b.append(c < 0x20 && c != '\n' && c != '\t' ? ' ' : c);
            }
        }
        return b.toString();
    }
}

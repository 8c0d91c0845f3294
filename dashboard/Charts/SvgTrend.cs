using System.Globalization;
using System.Net;
using System.Text;
using LoopWatch.Dashboard.Model;

namespace LoopWatch.Dashboard.Charts;

/// <summary>
/// Draws a PV/SP/OP trend as inline SVG on the server: PV and SP on the left axis in engineering units, OP on the
/// right axis in %. Series differ by line style as well as shade, so they read without colour. All text is encoded.
/// </summary>
public static class SvgTrend
{
    private const int W = 960, H = 330, Left = 64, Right = 56, Top = 26, Bottom = 36;

    /// <summary>The SVG markup of one trend.</summary>
    public static string Render(IReadOnlyList<TrendPoint> points, double pvMin, double pvMax, string unit, DateTimeOffset from, DateTimeOffset to,
        IReadOnlyList<TrendMarker>? markers = null, string title = "")
    {
        var sb = new StringBuilder(16 * 1024);
        var ci = CultureInfo.InvariantCulture;
        var span = Math.Max(1, (to - from).Ticks);
        double X(long ticks) => Left + (double)(ticks - from.UtcTicks) / span * (W - Left - Right);
        double Ypv(double v) => Top + (1 - (v - pvMin) / (pvMax - pvMin)) * (H - Top - Bottom);
        double Yop(double v) => Top + (1 - v / 100.0) * (H - Top - Bottom);

        sb.Append(ci, $"<svg class=\"trend\" xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {W} {H}\" role=\"img\" aria-label=\"{E(title)}\">");
        sb.Append(ci, $"<title>{E(title)}</title>");
        // Grid and axes: PV scale left, OP scale right.
        for (var i = 0; i <= 4; i++)
        {
            var y = Top + i * (H - Top - Bottom) / 4.0;
            sb.Append(ci, $"<line x1=\"{Left}\" x2=\"{W - Right}\" y1=\"{y:0.#}\" y2=\"{y:0.#}\" stroke=\"#d8d8d4\" stroke-width=\"1\"/>");
            var pv = pvMax - i * (pvMax - pvMin) / 4;
            sb.Append(ci, $"<text x=\"{Left - 6}\" y=\"{y + 4:0.#}\" text-anchor=\"end\">{E(pv.ToString("G4", ci))}</text>");
            sb.Append(ci, $"<text x=\"{W - Right + 6}\" y=\"{y + 4:0.#}\">{100 - i * 25}%</text>");
        }
        sb.Append(ci, $"<text x=\"{Left - 6}\" y=\"12\" text-anchor=\"end\">{E(unit)}</text>");
        for (var i = 0; i <= 6; i++)
        {
            var t = from + (to - from) * (i / 6.0);
            var x = Left + i * (W - Left - Right) / 6.0;
            sb.Append(ci, $"<text x=\"{x:0.#}\" y=\"{H - 14}\" text-anchor=\"middle\">{t.UtcDateTime.ToString("HH:mm", ci)}</text>");
        }
        foreach (var m in markers ?? [])
        {
            if (m.At < from || m.At > to) continue;
            var x = X(m.At.UtcTicks);
            sb.Append(ci, $"<g class=\"marker\"><line x1=\"{x:0.#}\" x2=\"{x:0.#}\" y1=\"{Top}\" y2=\"{H - Bottom}\" stroke=\"#b36b00\" stroke-dasharray=\"2 3\"/>");
            sb.Append(ci, $"<path d=\"M{x - 5:0.#},{Top} L{x + 5:0.#},{Top} L{x:0.#},{Top + 8}Z\" fill=\"#b36b00\"/><title>{E(m.Label)}</title></g>");
        }
        Series(sb, points, p => p.Sp, X, Ypv, "sp", "#6b6b6b", "6 4", 1.5);
        Series(sb, points, p => p.Op, X, Yop, "op", "#7d8fa3", "1 3", 1.5);
        Series(sb, points, p => p.Pv, X, Ypv, "pv", "#1f1f1f", null, 2);
        // Legend: name plus line style, never colour alone.
        Legend(sb, 0, "PV", "#1f1f1f", null);
        Legend(sb, 1, "SP", "#6b6b6b", "6 4");
        Legend(sb, 2, "OP %", "#7d8fa3", "1 3");
        sb.Append("</svg>");
        return sb.ToString();
    }

    private static void Series(StringBuilder sb, IReadOnlyList<TrendPoint> points, Func<TrendPoint, float> value, Func<long, double> x, Func<double, double> y,
        string name, string stroke, string? dash, double width)
    {
        var ci = CultureInfo.InvariantCulture;
        sb.Append(ci, $"<polyline class=\"series series-{name}\" data-series=\"{name}\" fill=\"none\" stroke=\"{stroke}\" stroke-width=\"{width}\"");
        if (dash is not null) sb.Append(ci, $" stroke-dasharray=\"{dash}\"");
        sb.Append(" points=\"");
        foreach (var p in points)
        {
            var v = value(p);
            if (!float.IsFinite(v)) continue;
            sb.Append(ci, $"{x(p.Ticks):0.#},{Math.Clamp(y(v), -1000, 10000):0.#} ");
        }
        sb.Append("\"/>");
    }

    private static void Legend(StringBuilder sb, int i, string label, string stroke, string? dash)
    {
        var ci = CultureInfo.InvariantCulture;
        var x = Left + 10 + i * 90;
        sb.Append(ci, $"<line x1=\"{x}\" x2=\"{x + 28}\" y1=\"{H - 4}\" y2=\"{H - 4}\" stroke=\"{stroke}\" stroke-width=\"2\"{(dash is null ? "" : $" stroke-dasharray=\"{dash}\"")}/>");
        sb.Append(ci, $"<text x=\"{x + 34}\" y=\"{H}\">{label}</text>");
    }

    private static string E(string s) => WebUtility.HtmlEncode(s);
}

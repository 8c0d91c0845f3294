using System.Globalization;
using System.Text;

namespace LoopWatch.Dashboard.Charts;

/// <summary>A small bar chart of a histogram (rainflow counts by move size), drawn on the server with a text label per bar.</summary>
public static class SvgBars
{
    /// <summary>Bars for <paramref name="counts"/> between consecutive <paramref name="edges"/>; heights on a log scale so rare large moves show.</summary>
    public static string Render(IReadOnlyList<double> edges, IReadOnlyList<double> counts, string label)
    {
        const int W = 320, H = 90, Bottom = 18;
        var ci = CultureInfo.InvariantCulture;
        var max = Math.Log10(1 + counts.DefaultIfEmpty(0).Max());
        var bw = (double)W / Math.Max(1, counts.Count);
        var sb = new StringBuilder();
        sb.Append(ci, $"<svg class=\"bars\" xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {W} {H}\" role=\"img\" aria-label=\"{System.Net.WebUtility.HtmlEncode(label)}\">");
        for (var i = 0; i < counts.Count; i++)
        {
            var h = max > 0 ? Math.Log10(1 + counts[i]) / max * (H - Bottom - 12) : 0;
            var x = i * bw;
            sb.Append(ci, $"<rect x=\"{x + 2:0.#}\" y=\"{H - Bottom - h:0.#}\" width=\"{bw - 4:0.#}\" height=\"{h:0.#}\" fill=\"#7d7d78\"><title>{edges[i]:0.#}-{edges[i + 1]:0.#} %: {counts[i]:0.#}</title></rect>");
            sb.Append(ci, $"<text x=\"{x + bw / 2:0.#}\" y=\"{H - Bottom - h - 2:0.#}\" text-anchor=\"middle\">{counts[i]:0.#}</text>");
            sb.Append(ci, $"<text x=\"{x + bw / 2:0.#}\" y=\"{H - 4}\" text-anchor=\"middle\">{edges[i]:0.#}-{edges[i + 1]:0.#}</text>");
        }
        sb.Append("</svg>");
        return sb.ToString();
    }
}

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// The usual historian cell, a plain decimal such as <c>-12.345</c> with at most 15 digits, read straight from its chars.
/// The result is exactly what the payload decoder gives: both digit run and power of ten are exact doubles, so one
/// IEEE division rounds correctly (Clinger's fast path, PLDI 1990). Anything else is left to the decoder.
/// </summary>
public static class PlainNumber
{
    private const int MaxDigits = 15;
    private static readonly double[] Pow10 = [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

    /// <summary>Reads <c>[-]digits[.digits]</c> (no spaces, exponent or sign other than a leading minus); false for anything else.</summary>
    public static bool TryParse(ReadOnlySpan<char> text, out double value)
    {
        value = 0;
        var i = 0;
        var negative = text.Length > 0 && text[0] == '-';
        if (negative) i = 1;
        long digits = 0;
        int count = 0, fraction = -1;
        for (; i < text.Length; i++)
        {
            var d = (uint)(text[i] - '0');
            if (d <= 9)
            {
                if (++count > MaxDigits) return false;
                digits = digits * 10 + d;
                if (fraction >= 0) fraction++;
            }
            else if (text[i] == '.' && fraction < 0 && count > 0) fraction = 0;
            else return false;
        }
        // "5." and "-0" are left to the decoder, whose reading of them is its own.
        if (count == 0 || fraction == 0 || (negative && digits == 0)) return false;
        var v = fraction > 0 ? digits / Pow10[fraction] : digits;
        value = negative ? -v : v;
        return true;
    }
}

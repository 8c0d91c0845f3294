namespace LoopWatch.Analytics.Performance;

/// <summary>
/// The Harris performance index (Harris 1989; Desborough and Harris 1992): an AR(p) model of the mean-removed control
/// error fitted by least squares (normal equations, Cholesky), its impulse response psi, the minimum variance from
/// the first b terms for a delay of b samples, and 1 - sigma_mv^2 / sigma_y^2. Every array is allocated once here.
/// </summary>
public sealed class HarrisIndex
{
    private readonly int _order, _delay;
    private readonly double[] _y, _normal, _rhs, _coefficients, _impulse;

    /// <summary>An index for windows of up to <paramref name="capacity"/> values, AR order <paramref name="order"/>, delay <paramref name="delay"/> samples.</summary>
    public HarrisIndex(int capacity, int order, int delay)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(order, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(delay, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 4 * order);
        _order = order;
        _delay = delay;
        _y = new double[capacity];
        _normal = new double[order * order];
        _rhs = new double[order];
        _coefficients = new double[order];
        _impulse = new double[delay];
    }

    /// <summary>Where the caller writes the window, oldest first; <see cref="Compute"/> reads the first n values.</summary>
    public Span<double> Input => _y;

    /// <summary>AR coefficients a_1..a_p of the last fit: y_t = a_1 y_(t-1) + ... + a_p y_(t-p) + e_t.</summary>
    public ReadOnlySpan<double> Coefficients => _coefficients;

    /// <summary>Impulse response psi_0..psi_(b-1) of the last fit (psi_0 = 1).</summary>
    public ReadOnlySpan<double> Impulse => _impulse;

    /// <summary>Fits the first <paramref name="n"/> values of <see cref="Input"/>; null when they have no variance or the fit is singular.</summary>
    public HarrisFigures? Compute(int n)
    {
        if (n < 4 * _order || n > _y.Length) throw new ArgumentOutOfRangeException(nameof(n));
        var y = _y.AsSpan(0, n);
        double mean = 0;
        foreach (var v in y) mean += v;
        mean /= n;
        double variance = 0;
        for (var i = 0; i < n; i++)
        {
            y[i] -= mean;
            variance += y[i] * y[i];
        }
        variance /= n;
        if (!(variance > 0)) return null;
        if (!Fit(y)) return null;

        var p = _order;
        double rss = 0;
        for (var t = p; t < n; t++)
        {
            var e = y[t];
            for (var i = 0; i < p; i++) e -= _coefficients[i] * y[t - 1 - i];
            rss += e * e;
        }
        var innovation = rss / (n - p);

        // psi_j = sum_i a_i psi_(j-i): the impulse response of 1 / (1 - a_1 q^-1 - ... - a_p q^-p).
        double sum = 0;
        for (var j = 0; j < _delay; j++)
        {
            var psi = j == 0 ? 1.0 : 0.0;
            for (var i = 1; i <= Math.Min(j, p); i++) psi += _coefficients[i - 1] * _impulse[j - i];
            _impulse[j] = psi;
            sum += psi * psi;
        }
        var minimum = innovation * sum;
        return new HarrisFigures(n, p, _delay, variance, innovation, minimum, 1 - minimum / variance);
    }

    private bool Fit(Span<double> y)
    {
        var p = _order;
        var n = y.Length;
        // Normal equations X'X a = X'y with row t holding y_(t-1)..y_(t-p), t = p..n-1. Only the first column of X'X is
        // summed over the window; each further entry is its upper-left neighbour shifted by one row, one product in and
        // one out, so a fit costs O(n p) rather than O(n p^2).
        for (var i = 0; i < p; i++)
        {
            double r = 0, s = 0;
            for (var t = p; t < n; t++)
            {
                r += y[t] * y[t - 1 - i];
                s += y[t - 1 - i] * y[t - 1];
            }
            _rhs[i] = r;
            _normal[i * p] = s;
        }
        for (var i = 0; i < p - 1; i++)
            for (var j = 0; j <= i; j++)
                _normal[(i + 1) * p + j + 1] = _normal[i * p + j] + y[p - 2 - i] * y[p - 2 - j] - y[n - 2 - i] * y[n - 2 - j];
        // Cholesky X'X = L L' in place (lower triangle), then L z = X'y and L' a = z.
        for (var j = 0; j < p; j++)
        {
            var d = _normal[j * p + j];
            for (var k = 0; k < j; k++) d -= _normal[j * p + k] * _normal[j * p + k];
            if (!(d > 0)) return false;
            d = Math.Sqrt(d);
            _normal[j * p + j] = d;
            for (var i = j + 1; i < p; i++)
            {
                var s = _normal[i * p + j];
                for (var k = 0; k < j; k++) s -= _normal[i * p + k] * _normal[j * p + k];
                _normal[i * p + j] = s / d;
            }
        }
        for (var i = 0; i < p; i++)
        {
            var s = _rhs[i];
            for (var k = 0; k < i; k++) s -= _normal[i * p + k] * _coefficients[k];
            _coefficients[i] = s / _normal[i * p + i];
        }
        for (var i = p - 1; i >= 0; i--)
        {
            var s = _coefficients[i];
            for (var k = i + 1; k < p; k++) s -= _normal[k * p + i] * _coefficients[k];
            _coefficients[i] = s / _normal[i * p + i];
        }
        return true;
    }
}

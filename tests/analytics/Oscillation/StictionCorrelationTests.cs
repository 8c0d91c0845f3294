using LoopWatch.Analytics.Oscillation;
using LoopWatch.Analytics.Windows;

namespace LoopWatch.Analytics.Tests.Oscillation;

public class StictionCorrelationTests
{
    private const int Period = 60;

    private static double Square(int t) => (t % Period) < Period / 2 ? 1 : -1;

    private static double Triangle(int t)
    {
        // The running integral of the square wave above: rises for half a period, then falls.
        var phase = t % Period;
        return phase < Period / 2 ? -1 + 4.0 * phase / Period : 3 - 4.0 * phase / Period;
    }

    private static (float[] Op, float[] Pv) Windows(Func<int, double> op, Func<int, double> pv)
    {
        var u = new float[1024];
        var y = new float[1024];
        for (var i = 0; i < u.Length; i++)
        {
            u[i] = (float)op(i);
            y[i] = (float)pv(i);
        }
        LagCorrelation.Center<float>(u);
        LagCorrelation.Center<float>(y);
        return (u, y);
    }

    [Fact]
    public void SquareOutput_TrianglePv_IsOdd_Stiction()
    {
        // A sticking valve in a PI loop: the valve jumps (square) and the PV follows it as an integral (triangle), 90 degrees behind.
        var (op, pv) = Windows(t => 50 + 5 * Square(t), t => 40 + 2 * Triangle(t));

        var phase = StictionCorrelation.PhaseDegrees(op, pv, Period);

        // Horch (1999): the OP-PV cross-correlation is odd under stiction, i.e. zero at lag 0 (phase 90 degrees).
        Assert.Equal(90, phase, 5.0);
        Assert.Equal(CauseHints.Stiction, StictionCorrelation.Classify(phase, 60, 30));
    }

    [Fact]
    public void SinusoidsInPhaseOpposition_AreEven_TuningOrDisturbance()
    {
        // Tight tuning: the output swings against the PV, half a period apart.
        var (op, pv) = Windows(t => 50 - 8 * Math.Sin(2 * Math.PI * t / Period), t => 40 + 2 * Math.Sin(2 * Math.PI * t / Period));

        var phase = StictionCorrelation.PhaseDegrees(op, pv, Period);

        // Horch (1999): an even cross-correlation (extreme at lag 0) points to tuning or a disturbance, not the valve.
        Assert.Equal(0, phase, 5.0);
        Assert.Equal(CauseHints.TuningOrDisturbance, StictionCorrelation.Classify(phase, 60, 30));
    }
}

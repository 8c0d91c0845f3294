using System.Globalization;
using System.Text.RegularExpressions;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Redoes by hand the figures that the dead-zone adviser's working prints, wherever it is shown.</summary>
public static partial class WorkedAdvice
{
    /// <summary>
    /// Checks the printed cycle of an integrating level, T = D / rise + D / fall and 60 / T starts an hour (wet-well rule,
    /// V/Qin + V/(Qp - Qin); pump-station handbooks, from memory), and returns the printed dead zone D.
    /// </summary>
    public static double CycleRedoes(string working)
    {
        var dead = DeadZoneLine().Match(working);
        Assert.True(dead.Success, working);
        var d = Num(dead, 1);
        var cycle = CycleLine().Match(working);
        Assert.True(cycle.Success, working);
        var t = Num(cycle, 3);
        Assert.Equal(d / Num(cycle, 1) + d / Num(cycle, 2), t, 2e-3 * t);
        Assert.Equal(60 / t, Num(cycle, 4), 2e-3 * Num(cycle, 4));
        return d;
    }

    private static double Num(Match m, int group) => double.Parse(m.Groups[group].Value, CultureInfo.InvariantCulture);

    [GeneratedRegex(@"dead zone now is D = (-?[0-9]+(?:\.[0-9]+)?)")]
    private static partial Regex DeadZoneLine();

    [GeneratedRegex(@"T = D / (-?[0-9]+(?:\.[0-9]+)?) \+ D / (-?[0-9]+(?:\.[0-9]+)?) = (-?[0-9]+(?:\.[0-9]+)?) min, so 60 / T = (-?[0-9]+(?:\.[0-9]+)?) starts/h")]
    private static partial Regex CycleLine();
}

using LoopWatch.Analytics.Reversals;

namespace LoopWatch.Analytics.Tests.Reversals;

public sealed class RainflowCounterTests
{
    // ASTM E1049-85 (reapproved 2017), 5.4.4 rainflow counting, worked example loading (from memory).
    private static readonly double[] AstmExample = [-2, 1, -3, 5, -1, 3, -4, 4, -2];

    [Fact]
    public void CountRecord_AstmE1049WorkedExample_GivesThePublishedCountsByRange()
    {
        var counts = RainflowCounter.CountRecord(AstmExample)
            .GroupBy(c => c.Range).ToDictionary(g => g.Key, g => g.Sum(c => c.Cycles));
        // Published table of ASTM E1049-85 5.4.4 as remembered: range 3: 0.5, 4: 1.5, 6: 0.5, 8: 1.0, 9: 0.5.
        // Checked by hand through the standard's steps: A-B (3) half with S, B-C (4) half with S, E-F (4) full,
        // C-D (8) half with S, then residue D-G (9), G-H (8), H-I (6) half each.
        Assert.Equal(new Dictionary<double, double> { [3] = 0.5, [4] = 1.5, [6] = 0.5, [8] = 1.0, [9] = 0.5 }, counts);
    }

    [Fact]
    public void Streaming_AstmE1049WorkedExample_FillsTheBinsOfThoseRanges()
    {
        var rf = new RainflowCounter();
        foreach (var p in AstmExample) rf.Add(p);
        var h = rf.Histogram();
        // Same published counts (ASTM E1049-85 5.4.4) binned: 3 and 4 fall in 2-5 (0.5 + 1.5), 6, 8, 9 in 5-10 (0.5 + 1 + 0.5).
        Assert.Equal(2.0, h[RainflowCounter.BinOf(3)]);
        Assert.Equal(3, RainflowCounter.BinOf(4.999));
        Assert.Equal(2.0, h[RainflowCounter.BinOf(9)]);
        Assert.Equal(4.0, h.Sum());
        // Before the end of the record only the closed part counts: the half cycles with S and the full cycle E-F.
        Assert.Equal(2.5, rf.ClosedCycles);
        Assert.Equal([5.0, -4, 4, -2], rf.Residue.ToArray());
    }

    [Fact]
    public void Seed_FromSavedHistogramAndResidue_ContinuesAsIfNeverStopped()
    {
        // Restoring from storage must not change the count (ASTM E1049-85 5.4.4 counts depend only on the sequence).
        var whole = new RainflowCounter();
        foreach (var p in AstmExample) whole.Add(p);

        var first = new RainflowCounter();
        foreach (var p in AstmExample[..5]) first.Add(p);
        var saved = first.Histogram(includeResidue: false);
        var residue = first.Residue.ToArray();
        var restored = new RainflowCounter();
        restored.Seed(saved, residue);
        foreach (var p in AstmExample[5..]) restored.Add(p);

        Assert.Equal(whole.Histogram(), restored.Histogram());
        Assert.Equal(whole.Residue.ToArray(), restored.Residue.ToArray());
    }

    [Fact]
    public void Add_PointsThatDoNotTurn_AreMergedIntoOneExtreme()
    {
        // Rainflow counts peaks and valleys only (ASTM E1049-85 5.4.4 works on reversal points).
        var counts = RainflowCounter.CountRecord([0, 2, 5, 1, 1, -3]);
        Assert.Equal([(5.0, 0.5), (8.0, 0.5)], counts);
    }

    [Fact]
    public void Add_BeyondResidueCapacity_CountsTheOldestRangeAsHalfAndKeepsTheTotal()
    {
        // A converging sequence never closes a cycle (ASTM E1049-85 5.4.4 step 3, X < Y), so the residue grows;
        // every range is still counted once, as a half cycle.
        var rf = new RainflowCounter(residueCapacity: 4);
        double[] converging = [0, 10, -10, 9, -9, 8, -8, 7, -7];
        foreach (var p in converging) rf.Add(p);
        Assert.Equal(4, rf.Residue.Length);
        Assert.Equal((converging.Length - 1) * 0.5, rf.Histogram().Sum());
    }
}

using LoopWatch.Agent.Plant;

namespace LoopWatch.Agent.Tests.Plant;

public sealed class ProcessModelTests
{
    [Fact]
    public void FirstOrderDeadTime_UnitStep_Reaches632PercentOneTimeConstantAfterTheDeadTime()
    {
        // Step response of K/(Ts+1) e^(-Ls): y(L+T) = K (1 - e^-1) = 0.632 K (textbook first-order response).
        var p = new FirstOrderDeadTime(gain: 2, tau: 30, deadTime: 5, dt: 0.1);
        var y = 0.0;
        for (var i = 0; i < 350; i++) y = p.Step(1); // 35 s = L + T
        Assert.Equal(2 * (1 - Math.Exp(-1)), y, 2);
        for (var i = 0; i < 3000; i++) y = p.Step(1);
        Assert.Equal(2, y, 3); // steady state equals the gain
    }

    [Fact]
    public void FirstOrderDeadTime_InputDoesNotReachOutputBeforeTheDeadTime()
    {
        var p = new FirstOrderDeadTime(1, 10, 5, 1);
        for (var i = 0; i < 5; i++) Assert.Equal(0, p.Step(1));
        Assert.True(p.Step(1) > 0);
    }

    [Fact]
    public void IntegratingTank_LevelRisesAtNetInflowOverArea()
    {
        // dh/dt = (Qin - Qout) / A (mass balance of a tank of constant section).
        var tank = new IntegratingTank(area: 4, height: 5, level: 1);
        for (var i = 0; i < 100; i++) tank.Step(0.05, 0.01, 1);
        Assert.Equal(1 + 100 * 0.04 / 4, tank.Level, 9);
    }

    [Fact]
    public void StictionValve_SticksUntilTheDemandHasMovedS_ThenSlipsByJ()
    {
        // Choudhury, Thornhill and Shah (2005): after a reversal the stem moves only once the demand has moved S
        // from where it stuck, and then jumps by J.
        var v = new StictionValve(s: 4, j: 1, initialPosition: 50);
        for (var d = 50.0; d <= 60; d += 0.5) v.Step(d);
        var moving = v.Position;
        Assert.Equal(60 - (4 - 1) / 2.0, moving, 9);
        var before = v.Position;
        double after = before;
        var demand = 60.0;
        while (after == before && demand > 40)
        {
            demand -= 0.25;
            after = v.Step(demand);
        }
        Assert.True(60 - demand > 4 && 60 - demand <= 4.25, $"moved after {60 - demand} % of reversal");
        // The jump is J plus however far the demand overshot the stickband in its last step.
        Assert.Equal(1 + (60 - demand - 4), before - after, 9);
    }

    [Fact]
    public void OnOffController_DeadZone_SwitchesOnlyAtTheEdges()
    {
        var pump = new OnOffController(low: 1.0, high: 1.4, directActing: true);
        Assert.False(pump.Step(1.2));
        Assert.True(pump.Step(1.4));
        Assert.True(pump.Step(1.1));
        Assert.False(pump.Step(1.0));
        Assert.Equal(1, pump.Starts);
    }

    [Fact]
    public void MeasurementNoise_FilteredNoise_KeepsTheAskedStandardDeviation()
    {
        var n = new MeasurementNoise(sigma: 0.5, filterTau: 5, dt: 1, seed: 7);
        var values = Enumerable.Range(0, 200_000).Select(_ => n.Next()).ToArray();
        // Reference: MathNet.Numerics sample standard deviation.
        Assert.Equal(0.5, MathNet.Numerics.Statistics.Statistics.StandardDeviation(values), 2);
    }

    [Fact]
    public void DemoPlant_ProportionalOnlyLoop_KeepsTheOffsetOfTheSeborgFormula()
    {
        // PIC-201: Kc = 2, Kp = 1, load step of -9 % at 900 s: offset = Kp * load / (1 + Kc Kp) = 3 % of span
        // (Seborg, Edgar and Mellichamp, Process Dynamics and Control, proportional control offset).
        var plant = new DemoPlant();
        var loop = (PidLoopModel)plant.Loops.Single(l => l.Options.Id == "PIC-201");
        for (var i = 0; i < 3600; i++) plant.Step();
        var spPct = loop.Reading.Sp / 10 * 100;
        Assert.Equal(3.0, spPct - loop.TruePvPct, 1);
    }

    [Fact]
    public void DemoPlant_HasTheLoopsTheScenarioPromises()
    {
        var ids = new DemoPlant().Configuration.Select(l => l.Id).ToArray();
        Assert.True(ids.Length >= 8);
        Assert.Contains("LIC-301", ids);
        Assert.All(new DemoPlant().Configuration, l => Assert.Matches("^[FLPT]I[CT]-\\d{3}$", l.Id!)); // ISA-5.1 letters: first F/L/P/T, then I, C
    }
}

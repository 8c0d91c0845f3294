namespace LoopWatch.Agent.Plant;

/// <summary>A tank of constant cross-section: dh/dt = (Qin - Qout) / A, clamped between empty and full.</summary>
public sealed class IntegratingTank
{
    private readonly double _area, _height;

    /// <summary>A tank of <paramref name="area"/> m2 and <paramref name="height"/> m, starting at <paramref name="level"/> m.</summary>
    public IntegratingTank(double area, double height, double level)
    {
        _area = area;
        _height = height;
        Level = level;
    }

    /// <summary>Level in metres.</summary>
    public double Level { get; private set; }

    /// <summary>Held volume in m3.</summary>
    public double Volume => Level * _area;

    /// <summary>Advances <paramref name="dt"/> s with flows in m3/s; returns the new level.</summary>
    public double Step(double inflow, double outflow, double dt)
    {
        Level = Math.Clamp(Level + (inflow - outflow) * dt / _area, 0, _height);
        return Level;
    }
}

namespace LoopWatch.Agent.Plant;

/// <summary>
/// A control valve with stiction after the two-parameter data-driven model of Choudhury, Thornhill and Shah
/// (Control Engineering Practice 13, 2005): S is deadband plus stickband, J the slip jump, both in % of stroke.
/// The stem sticks when the demanded direction changes or stops, and slips once the demand has moved S (on a reversal)
/// or J (onward in the same direction) from where it stuck.
/// </summary>
public sealed class StictionValve(double s, double j, double initialPosition)
{
    private double _xPrev = initialPosition, _xStuck = initialPosition;
    private int _dirBeforeStop;
    private bool _stuck = true;
    private int _lastDir;

    /// <summary>Stem position, % of stroke.</summary>
    public double Position { get; private set; } = initialPosition;

    /// <summary>Deadband plus stickband, % of stroke.</summary>
    public double S { get; } = s;

    /// <summary>Slip jump, % of stroke.</summary>
    public double J { get; } = j;

    /// <summary>Takes the controller output (%) and returns the stem position (%).</summary>
    public double Step(double demand)
    {
        var x = Math.Clamp(demand, 0, 100);
        var dir = Math.Sign(x - _xPrev);
        if (!_stuck && dir != _lastDir)
        {
            _stuck = true;
            _xStuck = _xPrev;
            _dirBeforeStop = _lastDir;
        }
        if (_stuck && dir != 0)
        {
            var band = dir == _dirBeforeStop ? J : S;
            if (Math.Abs(x - _xStuck) > band) _stuck = false;
        }
        if (!_stuck) Position = Math.Clamp(x - dir * (S - J) / 2, 0, 100);
        if (dir != 0) _lastDir = dir;
        else if (!_stuck) { _stuck = true; _xStuck = x; _dirBeforeStop = _lastDir; }
        _xPrev = x;
        return Position;
    }
}

namespace LoopWatch.Agent.Plant;

/// <summary>
/// A two-position controller with a dead zone (differential gap). Direct acting (a sump pump) switches on at the high
/// level and off at the low one; reverse acting (a heater) switches on at the low value and off at the high one.
/// </summary>
public sealed class OnOffController(double low, double high, bool directActing, bool initiallyOn = false)
{
    /// <summary>Lower switching point.</summary>
    public double Low { get; set; } = low;

    /// <summary>Upper switching point.</summary>
    public double High { get; set; } = high;

    /// <summary>True while the final element is on.</summary>
    public bool On { get; private set; } = initiallyOn;

    /// <summary>Number of off-to-on switchings so far.</summary>
    public long Starts { get; private set; }

    /// <summary>Takes a measurement and returns the new output state.</summary>
    public bool Step(double pv)
    {
        var on = On;
        if (directActing)
        {
            if (pv >= High) on = true;
            else if (pv <= Low) on = false;
        }
        else
        {
            if (pv <= Low) on = true;
            else if (pv >= High) on = false;
        }
        if (on && !On) Starts++;
        On = on;
        return on;
    }
}

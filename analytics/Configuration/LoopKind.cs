namespace LoopWatch.Analytics.Configuration;

/// <summary>The control strategy of a loop.</summary>
public enum LoopKind
{
    /// <summary>Continuous controller with a 0-100 % output.</summary>
    Pid,

    /// <summary>Two-position controller (pump, heater) with a 0/1 output.</summary>
    OnOff,
}

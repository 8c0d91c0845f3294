namespace LoopWatch.Agent.Discovery;

/// <summary>The part of a loop a topic looks like, by its last name part.</summary>
public enum TagRole : byte
{
    Pv,
    Sp,
    Op,
    Mode,
    Position,

    /// <summary><c>cv</c>: the controlled variable in advanced-control usage, the control value (output) in some controller makers' usage.</summary>
    Cv,
}

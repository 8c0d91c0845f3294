namespace LoopWatch.Analytics.Configuration;

/// <summary>How urgently an operator should respond to an alarm (ISA-18.2 uses a small number of priorities).</summary>
public enum AlarmPriority : byte
{
    Low,
    Medium,
    High,
}

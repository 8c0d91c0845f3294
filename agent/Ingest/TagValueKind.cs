namespace LoopWatch.Agent.Ingest;

/// <summary>What a tag carries, which decides the words a payload may use.</summary>
public enum TagValueKind : byte
{
    /// <summary>A number only (PV, SP, a pid output, valve position).</summary>
    Analog,

    /// <summary>On-off output: a number, or true/false/on/off.</summary>
    Binary,

    /// <summary>Controller mode: 0/1/2, true/false, or auto/manual/cascade.</summary>
    Mode,
}

namespace LoopWatch.Agent.Sparkplug;

/// <summary>The message types of a Sparkplug topic (Sparkplug 3.0, 4.1.3 "message_type Element").</summary>
public enum SparkplugMessageType : byte
{
    NBirth,
    NDeath,
    NData,
    NCmd,
    DBirth,
    DDeath,
    DData,
    DCmd,
}

namespace LoopWatch.Agent.Discovery;

/// <summary>What discovery saw on one topic (or Sparkplug metric): how many values, their range and what kind of words.</summary>
public sealed class ObservedTopic(string tag)
{
    /// <summary>The loop tag it would be: the MQTT topic, or <c>spBv1.0/group/edge[/device]:metric</c>.</summary>
    public string Tag { get; } = tag;

    public long Numbers { get; private set; }
    public long BooleanWords { get; private set; }
    public long ModeWords { get; private set; }
    public long Unreadable { get; private set; }
    public double Min { get; private set; } = double.PositiveInfinity;
    public double Max { get; private set; } = double.NegativeInfinity;

    /// <summary>True while every value seen was 0 or 1, true or false, on or off.</summary>
    public bool OnlyZeroOrOne { get; private set; } = true;

    /// <summary>Notes a number.</summary>
    public void Number(double value)
    {
        Numbers++;
        Min = Math.Min(Min, value);
        Max = Math.Max(Max, value);
        if (value is not (0 or 1)) OnlyZeroOrOne = false;
    }

    /// <summary>Notes a true/false/on/off word.</summary>
    public void Boolean() => BooleanWords++;

    /// <summary>Notes an auto/manual/cascade word.</summary>
    public void ModeWord()
    {
        ModeWords++;
        OnlyZeroOrOne = false;
    }

    /// <summary>Notes a payload that is no value.</summary>
    public void Unread() => Unreadable++;

    /// <summary>Values read of any kind.</summary>
    public long Values => Numbers + BooleanWords + ModeWords;
}

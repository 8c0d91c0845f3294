using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug;
using LoopWatch.Agent.Sparkplug.Wire;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Tests.Sparkplug;

public sealed class SparkplugTagTests
{
    [Theory]
    [InlineData("spBv1.0/Quillmoor/Intake/Skid1:FIC-501/PV", "Quillmoor", "Intake", "Skid1", "FIC-501/PV")]
    [InlineData("spBv1.0/Quillmoor/Intake:Node Control/Rebirth", "Quillmoor", "Intake", null, "Node Control/Rebirth")]
    [InlineData("spBv1.0/Quillmoor/Intake/Skid1:a:b", "Quillmoor", "Intake", "Skid1", "a:b")]
    public void TryParse_device_and_node_forms_split_at_the_first_colon(string tag, string group, string node, string? device, string metric)
    {
        Assert.True(SparkplugTag.TryParse(tag, out var t, out _));
        Assert.Equal(new SparkplugTag(group, node, device, metric), t);
    }

    [Theory]
    [InlineData("spBv1.0/Quillmoor/Intake/Skid1/FIC-501")]   // no metric
    [InlineData("spBv1.0/Quillmoor:FIC-501")]                // no edge node
    [InlineData("spBv1.0/Quillmoor/Intake/a/b:FIC-501")]     // too many ids
    [InlineData("spBv1.0/Quillmoor/+:FIC-501")]              // wildcard as id (4.1.2-4.1.5)
    public void TryParse_malformed_tags_say_why(string tag)
    {
        Assert.False(SparkplugTag.TryParse(tag, out _, out var problem));
        Assert.NotNull(problem);
    }

    [Fact]
    public void The_configuration_check_names_the_loop_and_key_of_a_malformed_Sparkplug_tag()
    {
        var options = new AgentOptions();
        options.Loops.Add(new LoopOptions
        {
            Id = "FIC-501", Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = "spBv1.0/Quillmoor/Intake/Skid1", Min = 0, Max = 10 },
            Sp = new SignalOptions { Tag = "spBv1.0/Quillmoor/Intake/Skid1:SP" }, Op = new SignalOptions { Tag = "spBv1.0/Quillmoor/Intake/Skid1:OP" },
        });
        options.Sparkplug.RebirthMinSeconds = 0;
        var errors = new List<string>();
        AgentOptionsCheck.Check(options, errors);
        Assert.Contains(errors, e => e.StartsWith("Loops:0 (FIC-501): Pv:Tag: Sparkplug tag", StringComparison.Ordinal));
        Assert.Contains("Sparkplug:RebirthMinSeconds: must be at least 1", errors);
        Assert.Equal(2, errors.Count);
    }

    [Theory]
    // 6.4.16 "Datatypes": signed integers travel as the two's complement bits in the unsigned field.
    [InlineData(DataType.Int8, 0xFFu, -1)]
    [InlineData(DataType.Int8, 0xFFFFFF80u, -128)]
    [InlineData(DataType.Int16, 0xFFFFFFFEu, -2)]
    [InlineData(DataType.Int32, 0x80000000u, int.MinValue)]
    [InlineData(DataType.Uint32, 0x80000000u, 2147483648.0)]
    public void Read_signed_integers_from_the_uint32_field(DataType type, uint raw, double expected)
    {
        var reason = SparkplugValue.Read(new Payload.Types.Metric { IntValue = raw }, type, TagValueKind.Analog, out var value, out _);
        Assert.Equal(RejectReason.None, reason);
        Assert.Equal(expected, value);
    }

    [Fact]
    public void Read_a_boolean_only_on_on_off_outputs_and_text_by_the_plain_payload_rules()
    {
        Assert.Equal(RejectReason.NotANumber, SparkplugValue.Read(new Payload.Types.Metric { BooleanValue = true }, DataType.Boolean, TagValueKind.Analog, out _, out _));
        Assert.Equal(RejectReason.None, SparkplugValue.Read(new Payload.Types.Metric { BooleanValue = true }, DataType.Boolean, TagValueKind.Binary, out var on, out _));
        Assert.Equal(1, on);
        Assert.Equal(RejectReason.None, SparkplugValue.Read(new Payload.Types.Metric { StringValue = "manual" }, DataType.String, TagValueKind.Mode, out var mode, out _));
        Assert.Equal((double)LoopMode.Manual, mode);
    }

    [Fact]
    public void Read_null_and_the_quality_property_as_the_specification_codes_them()
    {
        SparkplugValue.Read(new Payload.Types.Metric { IsNull = true }, DataType.Double, TagValueKind.Analog, out _, out var nullQuality);
        Assert.Equal(SampleQuality.Bad, nullQuality); // 6.4.5: is_null means no value
        var stale = new Payload.Types.Metric { DoubleValue = 1, Properties = new Payload.Types.PropertySet
        {
            Keys = { "Quality" }, Values = { new Payload.Types.PropertyValue { Type = (uint)DataType.Int32, IntValue = 500 } },
        } };
        SparkplugValue.Read(stale, DataType.Double, TagValueKind.Analog, out _, out var q);
        Assert.Equal(SampleQuality.Bad, q); // 6.4.9 "Quality Codes": 500 is STALE (from memory)
    }
}

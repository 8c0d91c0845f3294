namespace LoopWatch.Analytics.Configuration;

/// <summary>Checks the configured loops and turns them into <see cref="LoopSpec"/>s; every problem names the loop and the key.</summary>
public static class LoopOptionsCheck
{
    /// <summary>Checks all loops; returns the specs when <paramref name="errors"/> comes back empty.</summary>
    public static IReadOnlyList<LoopSpec> Check(IReadOnlyList<LoopOptions> loops, List<string> errors)
    {
        var specs = new List<LoopSpec>(loops.Count);
        var ids = new HashSet<string>(StringComparer.Ordinal);
        var tags = new Dictionary<string, string>(StringComparer.Ordinal);
        for (var i = 0; i < loops.Count; i++)
        {
            var spec = CheckOne(loops[i], i, errors, ids, tags);
            if (spec is not null) specs.Add(spec);
        }
        return specs;
    }

    private static LoopSpec? CheckOne(LoopOptions o, int index, List<string> errors, HashSet<string> ids, Dictionary<string, string> tags)
    {
        var before = errors.Count;
        var who = string.IsNullOrWhiteSpace(o.Id) ? $"Loops:{index}" : $"Loops:{index} ({o.Id})";
        void Fail(string key, string what) => errors.Add($"{who}: {key}: {what}");

        if (string.IsNullOrWhiteSpace(o.Id)) Fail("Id", "is missing");
        else if (!ids.Add(o.Id)) Fail("Id", $"'{o.Id}' is used by another loop");

        LoopKind kind = LoopKind.Pid;
        switch (o.Kind?.Trim().ToLowerInvariant())
        {
            case "pid": kind = LoopKind.Pid; break;
            case "on-off": kind = LoopKind.OnOff; break;
            case null or "": Fail("Kind", "is missing (pid or on-off)"); break;
            default: Fail("Kind", $"'{o.Kind}' is not one of pid, on-off"); break;
        }

        var process = ProcessKind.Other;
        if (o.Process is not null && !TryProcess(o.Process, out process))
            Fail("Process", $"'{o.Process}' is not one of flow, level, pressure, temperature, other");

        if (o.Pv is null || string.IsNullOrWhiteSpace(o.Pv.Tag)) Fail("Pv:Tag", "is missing");
        if (o.Pv?.Min is not { } min || !double.IsFinite(min)) { Fail("Pv:Min", "is missing or not a finite number"); min = 0; }
        if (o.Pv?.Max is not { } max || !double.IsFinite(max)) { Fail("Pv:Max", "is missing or not a finite number"); max = 0; }
        if (o.Pv?.Min is not null && o.Pv?.Max is not null && min >= max) Fail("Pv:Max", $"must be above Pv:Min ({min} >= {max})");
        if (o.Op is null || string.IsNullOrWhiteSpace(o.Op.Tag)) Fail("Op:Tag", "is missing");
        if (kind == LoopKind.Pid && (o.Sp is null || string.IsNullOrWhiteSpace(o.Sp.Tag))) Fail("Sp:Tag", "is missing (required for pid loops)");

        foreach (var (key, signal) in new[] { ("Pv:Tag", o.Pv), ("Sp:Tag", o.Sp), ("Op:Tag", o.Op), ("Mode:Tag", o.Mode), ("Position:Tag", o.Position) })
        {
            if (signal?.Tag is not { Length: > 0 } tag) continue;
            if (tags.TryGetValue(tag, out var owner)) Fail(key, $"tag '{tag}' is already used by {owner}");
            else tags[tag] = $"{o.Id} {key}";
        }

        var limits = LimitDefaults.Resolve(process, o.Limits);
        CheckPositive(limits.OffsetPct, "Limits:OffsetPct", Fail);
        CheckPositive(limits.OffsetMinSeconds, "Limits:OffsetMinSeconds", Fail);
        CheckPositive(limits.MaxStartsPerHour, "Limits:MaxStartsPerHour", Fail);
        CheckPositive(limits.MaxReversalsPerHour, "Limits:MaxReversalsPerHour", Fail);
        CheckPositive(limits.OscillationAmplitudePct, "Limits:OscillationAmplitudePct", Fail);
        CheckPositive(limits.StaleSeconds, "Limits:StaleSeconds", Fail);
        CheckPositive(limits.SampleSeconds, "Limits:SampleSeconds", Fail);
        if (!(limits.ReversalDeadbandPct >= 0 && limits.ReversalDeadbandPct < 50)) Fail("Limits:ReversalDeadbandPct", "must be at least 0 and below 50");
        if (limits.StaleSeconds < limits.SampleSeconds) Fail("Limits:StaleSeconds", "must not be shorter than Limits:SampleSeconds");

        var tuning = CheckTuning(o.Tuning, Fail);
        var alarms = CheckAlarms(o.Alarms, process, Fail);
        if (errors.Count != before) return null;
        return new LoopSpec(o.Id!, o.Description ?? "", o.Area ?? "", kind, process,
            o.Pv!.Tag!, min, max, o.Pv.Unit ?? "", NullIfEmpty(o.Sp?.Tag), o.Op!.Tag!, NullIfEmpty(o.Mode?.Tag), NullIfEmpty(o.Position?.Tag),
            limits, tuning) { Alarms = alarms };
    }

    private static LoopAlarmLimits CheckAlarms(AlarmOptions? a, ProcessKind process, Action<string, string> fail)
    {
        var d = AlarmDefaults.For(process);
        if (a is null) return d;
        if (a.DeadbandPct is { } db && !(db >= 0 && db < 50)) fail("Alarms:DeadbandPct", "must be at least 0 and below 50");
        if (a.OnDelaySeconds is { } on && !(on >= 0 && double.IsFinite(on))) fail("Alarms:OnDelaySeconds", "must be zero or a positive number");
        if (a.OffDelaySeconds is { } off && !(off >= 0 && double.IsFinite(off))) fail("Alarms:OffDelaySeconds", "must be zero or a positive number");
        var priorities = new Dictionary<string, AlarmPriority>(StringComparer.Ordinal);
        foreach (var (kind, text) in a.Priorities ?? [])
        {
            if (!Findings.FindingKinds.All.Contains(kind)) fail($"Alarms:Priorities:{kind}", $"'{kind}' is not a finding kind ({string.Join(", ", Findings.FindingKinds.All)})");
            else if (!Enum.TryParse<AlarmPriority>(text, ignoreCase: true, out var p) || !Enum.IsDefined(p) || int.TryParse(text, out _))
                fail($"Alarms:Priorities:{kind}", $"'{text}' is not one of low, medium, high");
            else priorities[kind] = p;
        }
        var windows = new List<AlarmWindow>();
        for (var i = 0; i < (a.ActiveWhen?.Count ?? 0); i++)
        {
            if (AlarmWindow.TryParse(a.ActiveWhen![i], out var w)) windows.Add(w);
            else fail($"Alarms:ActiveWhen:{i}", $"'{a.ActiveWhen[i]}' is not a window like 06:00-22:00");
        }
        var zone = string.IsNullOrWhiteSpace(a.TimeZone) ? d.TimeZone : a.TimeZone.Trim();
        // Reads the system's time zone table once at configuration time; the analytics never touch it afterwards.
        if (!TimeZoneInfo.TryFindSystemTimeZoneById(zone, out _)) fail("Alarms:TimeZone", $"'{zone}' is not a known time zone");
        return new LoopAlarmLimits(a.DeadbandPct ?? d.DeadbandPct, a.OnDelaySeconds ?? d.OnDelaySeconds,
            a.OffDelaySeconds ?? d.OffDelaySeconds, priorities, windows, zone);
    }

    private static LoopTuning CheckTuning(TuningOptions? t, Action<string, string> fail)
    {
        if (t is null) return LoopTuning.None;
        if (t.Kc is { } kc && !(kc > 0 && double.IsFinite(kc))) fail("Tuning:Kc", "must be a positive number");
        if (t.PbPct is { } pb && !(pb > 0 && double.IsFinite(pb))) fail("Tuning:PbPct", "must be a positive number");
        if (t.Kc is not null && t.PbPct is not null && Math.Abs(t.Kc.Value * t.PbPct.Value - 100) > 1e-6 * 100)
            fail("Tuning:PbPct", "disagrees with Tuning:Kc (PB % = 100 / Kc); give one of them");
        if (t.TiSeconds is { } ti && !(ti > 0 && double.IsFinite(ti))) fail("Tuning:TiSeconds", "must be a positive number");
        if (t.TdSeconds is { } td && !(td >= 0 && double.IsFinite(td))) fail("Tuning:TdSeconds", "must be zero or a positive number");
        if (t.DeadTimeSeconds is { } dt && !(dt > 0 && double.IsFinite(dt))) fail("Tuning:DeadTimeSeconds", "must be a positive number");
        if (t.TimeConstantSeconds is { } tau && !(tau > 0 && double.IsFinite(tau))) fail("Tuning:TimeConstantSeconds", "must be a positive number");
        var gain = t.Kc ?? (t.PbPct is { } p && p > 0 ? 100.0 / p : null);
        return new LoopTuning(gain, t.TiSeconds, t.TdSeconds, t.DeadTimeSeconds) { TimeConstantSeconds = t.TimeConstantSeconds };
    }

    private static void CheckPositive(double value, string key, Action<string, string> fail)
    {
        if (!(value > 0 && double.IsFinite(value))) fail(key, "must be a positive number");
    }

    private static bool TryProcess(string text, out ProcessKind process)
    {
        process = text.Trim().ToLowerInvariant() switch
        {
            "flow" => ProcessKind.Flow,
            "level" => ProcessKind.Level,
            "pressure" => ProcessKind.Pressure,
            "temperature" => ProcessKind.Temperature,
            "other" => ProcessKind.Other,
            _ => (ProcessKind)(-1),
        };
        return Enum.IsDefined(process);
    }

    private static string? NullIfEmpty(string? s) => string.IsNullOrWhiteSpace(s) ? null : s;
}

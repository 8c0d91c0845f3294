using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Configuration;

/// <summary>Checks everything in <see cref="AgentOptions"/>; each message names the key.</summary>
public static class AgentOptionsCheck
{
    /// <summary>The settings any client of the broker needs (the agent, <c>discover</c>): address, credentials and TLS.</summary>
    public static void ClientSettings(BrokerOptions b, List<string> errors)
    {
        if (string.IsNullOrWhiteSpace(b.Host)) errors.Add("Broker:Host: is missing");
        if (b.Port is < 1 or > 65535) errors.Add($"Broker:Port: {b.Port} is not a TCP port (1-65535)");
        if (b.Username is null && b.Password is not null) errors.Add("Broker:Username: is missing while Broker:Password is set");
        // MQTT carries the keep-alive in two bytes; 0 would turn it off and leave a dead connection unnoticed.
        if (b.KeepAliveSeconds is < 5 or > 65535) errors.Add($"Broker:KeepAliveSeconds: {b.KeepAliveSeconds} is not 5 to 65535 seconds");
        errors.AddRange(Broker.BrokerTls.Check(b));
    }

    /// <summary>Returns the specs of the loops this agent takes (its shard); <paramref name="errors"/> lists every problem found.</summary>
    public static IReadOnlyList<LoopSpec> Check(AgentOptions options, List<string> errors)
    {
        var b = options.Broker;
        ClientSettings(b, errors);
        if (string.IsNullOrWhiteSpace(b.ClientId)) errors.Add("Broker:ClientId: is missing");
        if (b.MaxPendingMessagesPerClient < 1) errors.Add("Broker:MaxPendingMessagesPerClient: must be at least 1");
        if (!(b.MaxLeadSeconds >= 0 && double.IsFinite(b.MaxLeadSeconds))) errors.Add($"Broker:MaxLeadSeconds: {b.MaxLeadSeconds} must be zero or more seconds");
        if (!System.Net.IPAddress.TryParse(b.ListenAddress, out var listen)) errors.Add($"Broker:ListenAddress: '{b.ListenAddress}' is not an IP address");
        else if (b.Embedded && !System.Net.IPAddress.IsLoopback(listen) && (string.IsNullOrEmpty(b.Username) || string.IsNullOrEmpty(b.Password)))
            errors.Add($"Broker:ListenAddress: the embedded broker on {listen}, off loopback, needs Broker:Username and Broker:Password");
        foreach (var url in (options.Dashboard.Urls ?? "").Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!Uri.TryCreate(url, UriKind.Absolute, out var uri) || (uri.Scheme != "http" && uri.Scheme != "https"))
                errors.Add($"Dashboard:Urls: '{url}' is not an http(s) address");
        }
        var d = options.Dashboard;
        if (d.ShiftStartHour is < 0 or > 23) errors.Add($"Dashboard:ShiftStartHour: {d.ShiftStartHour} is not an hour of the day (0-23)");
        if (d.ShiftHours is < 1 or > 24 || 24 % d.ShiftHours != 0) errors.Add($"Dashboard:ShiftHours: {d.ShiftHours} does not divide the day (1, 2, 3, 4, 6, 8, 12 or 24)");
        if (!TimeZoneInfo.TryFindSystemTimeZoneById(d.TimeZone ?? "", out _)) errors.Add($"Dashboard:TimeZone: '{d.TimeZone}' is not a known time zone");
        if (string.IsNullOrWhiteSpace(options.Dashboard.Urls)) errors.Add("Dashboard:Urls: is missing");
        if (d.MetricsAccess is not ("viewing" or "open" or "off")) errors.Add($"Dashboard:MetricsAccess: '{d.MetricsAccess}' is not viewing, open or off");
        var own = Path.GetFullPath(Path.Combine(string.IsNullOrWhiteSpace(options.DataDir) ? "." : options.DataDir, Storage.AgentStorage.FileName));
        for (var i = 0; i < d.WeeklyDatabases.Count; i++)
        {
            var file = d.WeeklyDatabases[i];
            // A missing file is not refused here: the other agent may start later; the page names it until it is there.
            if (string.IsNullOrWhiteSpace(file)) errors.Add($"Dashboard:WeeklyDatabases:{i}: is empty");
            else if (Path.GetFullPath(file) == own) errors.Add($"Dashboard:WeeklyDatabases:{i}: '{file}' is this agent's own database");
        }
        if (string.IsNullOrWhiteSpace(options.DataDir)) errors.Add("DataDir: is missing");
        if (options.Valves.ServiceAfterReversals < 1) errors.Add("Valves:ServiceAfterReversals: must be at least 1");
        if (!(options.Valves.ServiceAfterStrokes > 0)) errors.Add("Valves:ServiceAfterStrokes: must be a positive number");
        if (!(options.Valves.SaveEverySeconds >= 1)) errors.Add("Valves:SaveEverySeconds: must be at least 1");
        if (options.Loops.Count == 0) errors.Add("Loops: no loop is configured");
        errors.AddRange(options.AlarmSystem.Check(options.Loops.SelectMany(l => new[] { l.Pv?.Tag, l.Sp?.Tag, l.Op?.Tag, l.Mode?.Tag, l.Position?.Tag }).OfType<string>()));
        errors.AddRange(options.Sparkplug.Check(options.Loops.SelectMany((l, i) => new[] { ("Pv", l.Pv), ("Sp", l.Sp), ("Op", l.Op), ("Mode", l.Mode), ("Position", l.Position) }
            .Where(s => s.Item2?.Tag is { Length: > 0 }).Select(s => ($"Loops:{i} ({l.Id}): {s.Item1}:Tag", s.Item2!.Tag!)))));
        var shardErrors = options.Shard.Check().ToList();
        errors.AddRange(shardErrors);
        // Every loop is checked whichever agent takes it, so all agents of a plant agree on a valid list.
        var specs = LoopOptionsCheck.Check(options.Loops, errors);
        return options.Shard.Count > 1 && shardErrors.Count == 0 ? specs.Where(s => options.Shard.Takes(s.Id)).ToList() : specs;
    }
}

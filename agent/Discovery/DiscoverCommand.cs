using System.Buffers;
using System.Globalization;
using LoopWatch.Agent.Broker;
using LoopWatch.Agent.Configuration;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Discovery;

/// <summary>
/// <c>loopwatch discover [--broker host:port] [--config FILE] [--seconds 30] [--out FILE]</c>: listens to every topic
/// (Sparkplug births included), then writes a proposed configuration for the engineer to review. It only subscribes;
/// it never publishes. Credentials and TLS come from the configuration file's Broker section and the environment.
/// </summary>
public static class DiscoverCommand
{
    /// <summary>Runs the verb; 0 ok, 1 broker unreachable, 2 usage error.</summary>
    public static async Task<int> RunAsync(CliArguments cli, List<string> errors, TextWriter stdout, TextWriter stderr, TimeProvider time, CancellationToken stop)
    {
        var broker = cli.Get("broker");
        var configFile = cli.Get("config");
        var seconds = cli.Number("seconds", 30, errors);
        var outFile = cli.Get("out");
        var overrides = new Dictionary<string, string?>();
        if (broker is null && configFile is null) errors.Add("--broker: is required (host:port), or --config with a Broker section");
        else if (broker is not null)
        {
            var colon = broker.LastIndexOf(':');
            if (colon <= 0 || !int.TryParse(broker[(colon + 1)..], NumberStyles.None, CultureInfo.InvariantCulture, out var given) || given is < 1 or > 65535)
                errors.Add($"--broker: '{broker}' is not host:port");
            else
            {
                overrides["LoopWatch:Broker:Host"] = broker[..colon];
                overrides["LoopWatch:Broker:Port"] = given.ToString(CultureInfo.InvariantCulture);
            }
        }
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for 'discover'");
        if (cli.Operands.Count > 0) errors.Add($"unexpected argument '{cli.Operands[0]}'");
        // The agent's own loading (file, then LOOPWATCH__BROKER__... variables, then --broker), so discover reaches the
        // broker exactly as the agent will; only the Broker section is used.
        var b = errors.Count == 0 ? AgentConfiguration.Load(configFile, overrides, errors).Broker : new BrokerOptions();
        if (errors.Count == 0) AgentOptionsCheck.ClientSettings(b, errors);
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch: {e}");
            return 2;
        }
        var (host, port) = (b.Host, b.Port);

        string? refusal = null;
        var survey = new TopicSurvey();
        using var client = new MqttClientFactory().CreateMqttClient();
        client.ApplicationMessageReceivedAsync += e =>
        {
            var payload = e.ApplicationMessage.Payload;
            survey.Observe(e.ApplicationMessage.Topic, payload.IsSingleSegment ? payload.FirstSpan : payload.ToArray());
            return Task.CompletedTask;
        };
        try
        {
            await client.ConnectAsync(BrokerClient.Builder(b, $"loopwatch-discover-{Guid.NewGuid():N}", refused: reason => refusal = reason)
                .WithCleanSession().Build(), stop);
            // '#' covers the Sparkplug namespace too; retained values arrive at once, births whenever a node (re)starts.
            await client.SubscribeAsync(new MqttClientSubscribeOptionsBuilder()
                .WithTopicFilter(f => f.WithTopic("#").WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtMostOnce)).Build(), stop);
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            stderr.WriteLine($"loopwatch: broker {host}:{port} unreachable: {e.Message}" + (refusal is null ? "" : $"; {refusal}"));
            return 1;
        }
        stderr.WriteLine($"discover: listening to {host}:{port}{(b.UseTls ? " over TLS" : "")} for {seconds:0.#} s");
        await Task.Delay(TimeSpan.FromSeconds(seconds), time, stop).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
        catch (Exception) { /* the proposal stands on what was heard */ }

        var topics = survey.Topics();
        var proposal = LoopProposer.Propose(topics);
        var text = ProposalWriter.Write(proposal, host, port, survey.Messages, seconds);
        if (outFile is null) stdout.Write(text);
        else await File.WriteAllTextAsync(outFile, text, CancellationToken.None);
        stderr.WriteLine($"discover: {survey.Messages} messages on {topics.Count} topics; {proposal.Loops.Count} loops proposed, {proposal.Unpaired.Count} topics not paired"
            + (survey.UnknownAliases > 0 ? $"; {survey.UnknownAliases} Sparkplug metrics by unknown alias (listen while the edge nodes are born to see them)" : "")
            + (outFile is null ? "" : $"; written to {outFile}"));
        stderr.WriteLine("discover: review every loop and its reasons before use, then run 'loopwatch check --config FILE'");
        return 0;
    }
}

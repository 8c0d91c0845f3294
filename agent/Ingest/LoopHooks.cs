using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Monitoring;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// Extra per-loop detectors the host adds after the analytics ones (hourly statistics, alarms); each is built with
/// the loop's spec and a way to read the loop's statistics from inside <see cref="LoopDetector.Step"/>.
/// </summary>
public delegate IEnumerable<LoopDetector> LoopHooks(LoopSpec spec, Func<LoopStatistics> statistics);

namespace LoopWatch.Agent.Discovery;

/// <summary>What discovery proposes: loops for the engineer to review, and the topics it could not pair.</summary>
public sealed record LoopProposal(IReadOnlyList<ProposedLoop> Loops, IReadOnlyList<UnpairedTopic> Unpaired);

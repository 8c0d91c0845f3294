namespace LoopWatch.Storage.Writing;

/// <summary>One committed batch of the writer: how many rows it carried and how long its transaction took.</summary>
public readonly record struct BatchCommit(int Rows, TimeSpan Duration);

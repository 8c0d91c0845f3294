namespace LoopWatch.Storage;

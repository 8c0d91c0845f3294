namespace LoopWatch.Dashboard;

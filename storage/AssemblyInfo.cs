using System.Runtime.CompilerServices;

[assembly: InternalsVisibleTo("LoopWatch.Storage.Tests")]
[assembly: InternalsVisibleTo("LoopWatch.Bench")]

namespace LoopWatch.Storage;

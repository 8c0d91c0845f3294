namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>A certificate and key issued by <see cref="TestPki"/>: their PEM files, and the key's PEM text to look for in logs.</summary>
public sealed record IssuedCertificate(string CertFile, string KeyFile, string KeyPem);

const { Client } = require('pg');

module.exports = async function globalTeardown() {
  const name = process.env.BASTED_TEST_DATABASE;
  const adminUrl = process.env.BASTED_ADMIN_DATABASE_URL;
  if (!name || !adminUrl || !/^basted_test_\w+$/.test(name)) return;
  const admin = new Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  } finally {
    await admin.end();
  }
};
